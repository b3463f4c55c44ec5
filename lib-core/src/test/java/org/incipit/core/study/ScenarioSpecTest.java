package org.incipit.core.study;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** The scenario file format (docs/scenarios.md) and the registry. */
class ScenarioSpecTest {

    static final String FILE = String.join("\n",
            "# calibration",
            "name = normal-check",
            "description = Normal samples; t interval = exact",
            "generator = sample",
            "estimators = normal-mean-t , normal-variance-mle",
            "family = normal",
            "mean = 5",
            "sd = 2",
            "truth.variance = 4",
            "setting.spread = 1.5",
            "option.note = unused text",
            "sizes = 5, 10,20",
            "replicates = 50",
            "seed = -42",
            "level = 0.9",
            "");

    @Test
    void parsesEveryKey() {
        ScenarioSpec s = ScenarioSpec.parse(FILE, "f.scenario");
        assertEquals("normal-check", s.scenario().name());
        assertEquals("Normal samples; t interval = exact", s.description());
        assertEquals("sample", s.generator());
        assertEquals(List.of("normal-mean-t", "normal-variance-mle"), s.estimators());
        assertEquals(Map.of("mean", 5.0, "sd", 2.0, "variance", 4.0), s.scenario().truths());
        assertEquals(Map.of("spread", 1.5), s.scenario().settings());
        assertEquals(Map.of("family", "normal", "note", "unused text"), s.scenario().options());
        assertArrayEquals(new int[] {5, 10, 20}, s.sampleSizes());
        assertEquals(50, s.replicates());
        assertEquals(-42, s.seed());
        assertEquals(0.9, s.level());
        assertEquals(0.95, ScenarioSpec.parse(FILE.replace("level = 0.9\n", ""), "f").level());
        assertEquals(s, ScenarioSpec.parse(FILE.replace("sizes = 5, 10,20", "sizes=5,10,20"), "g"));
        assertEquals(s.hashCode(), ScenarioSpec.parse(FILE, "g").hashCode());
    }

    @Test
    void registryBuildsAndRunsTheStudy() {
        Study<?> study = StudyRegistry.standard().study(ScenarioSpec.parse(FILE, "f"));
        assertEquals(List.of("normal-mean-t", "normal-variance-mle"), study.estimatorNames());
        assertEquals(0.9, study.level());
        List<StudySummary> rows = study.run(Runnable::run, StudyListener.NONE).summaries();
        assertEquals(6, rows.size());
        assertEquals("variance", rows.get(5).target());
        assertEquals(20, rows.get(5).sampleSize());
        assertEquals(0.9, rows.get(0).level());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "replicates = 50|replicates = 0|f:13: replicates must be >= 1, was 0",
        "replicates = 50|replicates = many|f:13: 'replicates' must hold integers, had 'many'",
        "sizes = 5, 10,20|sizes = 5, 5|f:12: sample sizes must be distinct, were [5, 5]",
        "sizes = 5, 10,20|sizes = 5, 0|f:12: sample sizes must be >= 1, had 0",
        "mean = 5|mean = five|f:7: 'mean' must be a number, was 'five'",
        "mean = 5|mean = NaN|f:7: 'mean' must be finite, was 'NaN'",
        "mean = 5|means = 5|f:7: unknown key 'means'; see docs/scenarios.md",
        "mean = 5|mean 5|f:7: expected 'key = value', was 'mean 5'",
        "mean = 5|mean =|f:7: key 'mean' has no value",
        "level = 0.9|level = 1.5|f:15: level must be in (0, 1), was 1.5",
        "seed = -42|seed = 1e3|f:14: seed must be a decimal 64-bit integer, was '1e3'",
        "name = normal-check|name = normal check|f:2: scenario name must be letters, digits, '.', '_' or '-', was 'normal check'",
        "seed = -42|mean = 6|f:14: key 'mean' repeats line 7",
        "replicates = 50|#|f: required key 'replicates' is missing",
        "truth.variance = 4|truth.sd = 4|f:9: truth 'sd' is given twice",
        "option.note = unused text|option.family = gamma|f:11: option 'family' is given twice"
    })
    void errorsNameLineAndKey(String from, String to, String message) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> ScenarioSpec.parse(FILE.replace(from, to), "f"));
        assertEquals(message, e.getMessage());
    }

    @Test
    void registryRejectsUnknownNamesAndMismatchedTypes() {
        StudyRegistry reg = StudyRegistry.standard().toBuilder()
                .generator("counts", int[].class, s -> (rng, sc, n) -> new int[n])
                .build();
        assertTrue(reg.generatorNames().contains("counts"));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> reg.study(ScenarioSpec.parse(FILE.replace("generator = sample", "generator = counts"), "f")));
        assertEquals("estimator 'normal-mean-t' takes double[] but generator 'counts' makes int[]", e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> reg.study(ScenarioSpec.parse(FILE.replace("generator = sample", "generator = none"), "f")));
        assertEquals("unknown generator 'none'; known: " + reg.generatorNames(), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> reg.study(ScenarioSpec.parse(FILE.replace("normal-mean-t ,", "median,"), "f")));
        assertTrue(e.getMessage().startsWith("unknown estimator 'median'"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> reg.study(ScenarioSpec.parse(FILE.replace("truth.variance = 4", "truth.variance = 5"), "f")));
        assertEquals("truth 'variance' (5.0) must equal sd^2 (4.0)", e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> reg.study(ScenarioSpec.parse(FILE.replace("family = normal", "family = gamma"), "f")));
        assertEquals("generator 'sample' needs family = normal or exponential, was 'gamma'", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> StudyRegistry.standard().toBuilder()
                .estimator("normal-mean-t", double[].class, (s, l) -> CalibrationModels.meanT(l)));
    }
}
