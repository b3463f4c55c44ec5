package org.incipit.core.study;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * A scenario file as read: the {@link Scenario}, the registry names of the data generator and
 * estimators, sample sizes, replicates, seed and level. {@link StudyRegistry#study(ScenarioSpec)}
 * turns it into a {@link Study}.
 *
 * <p>The file format (docs/scenarios.md): UTF-8 text, one {@code key = value} per line, blank
 * lines and lines starting with {@code #} ignored, keys case-sensitive, each key at most once,
 * unknown keys rejected. Keys:
 * <pre>
 * name        = normal-calibration        required; letters, digits, . _ -
 * description = free text                 optional
 * generator   = sample                    required; registry name
 * estimators  = normal-mean-t, normal-variance-mle   required; registry names
 * family      = normal                    optional text option "family"
 * mean, sd, p, r, fatality = number       optional true values of those names
 * truth.NAME  = number                    any other true value (e.g. truth.R)
 * setting.NAME = number                   numeric generator setting
 * option.NAME = text                      text generator option
 * sizes       = 10, 20, 50                required; distinct integers &ge; 1
 * replicates  = 1000                      required; integer &ge; 1
 * seed        = 20261201                  required; decimal integer (64-bit)
 * level       = 0.95                      optional, default 0.95
 * </pre>
 * An error names the source, the line and the key.
 *
 * @param scenario    true values and settings
 * @param description free text, may be empty
 * @param generator   registry name of the data generator
 * @param estimators  registry names of the estimators; copied
 * @param sampleSizes sample sizes; copied
 * @param replicates  replicates per sample size
 * @param seed        master seed
 * @param level       nominal interval level
 */
public record ScenarioSpec(Scenario scenario, String description, String generator, List<String> estimators,
                           int[] sampleSizes, int replicates, long seed, double level) {

    private static final List<String> TRUTH_KEYS = List.of("mean", "sd", "p", "r", "fatality");

    /**
     * Validates and copies.
     *
     * @param scenario    not null
     * @param description not null
     * @param generator   a registry name
     * @param estimators  registry names, at least one
     * @param sampleSizes at least one, &ge; 1
     * @param replicates  &ge; 1
     * @param seed        any
     * @param level       in (0, 1)
     * @throws IllegalArgumentException if a value is out of range
     */
    public ScenarioSpec {
        if (scenario == null || description == null) {
            throw new IllegalArgumentException("scenario and description must not be null");
        }
        Scenario.requireName("generator name", generator);
        if (estimators == null || estimators.isEmpty()) {
            throw new IllegalArgumentException("at least one estimator must be named");
        }
        for (String e : estimators) {
            Scenario.requireName("estimator name", e);
        }
        estimators = List.copyOf(estimators);
        if (sampleSizes == null || sampleSizes.length == 0) {
            throw new IllegalArgumentException("at least one sample size is required");
        }
        sampleSizes = sampleSizes.clone();
        for (int n : sampleSizes) {
            if (n < 1) {
                throw new IllegalArgumentException("sample sizes must be >= 1, had " + n);
            }
        }
        if (replicates < 1) {
            throw new IllegalArgumentException("replicates must be >= 1, was " + replicates);
        }
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
    }

    @Override
    public int[] sampleSizes() {
        return sampleSizes.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ScenarioSpec s && scenario.equals(s.scenario) && description.equals(s.description)
                && generator.equals(s.generator) && estimators.equals(s.estimators)
                && Arrays.equals(sampleSizes, s.sampleSizes) && replicates == s.replicates && seed == s.seed
                && Double.compare(level, s.level) == 0;
    }

    @Override
    public int hashCode() {
        return (scenario.hashCode() * 31 + Arrays.hashCode(sampleSizes)) * 31 + Long.hashCode(seed);
    }

    @Override
    public String toString() {
        return "ScenarioSpec[scenario=" + scenario + ", generator=" + generator + ", estimators=" + estimators
                + ", sampleSizes=" + Arrays.toString(sampleSizes) + ", replicates=" + replicates + ", seed=" + seed
                + ", level=" + level + "]";
    }

    /**
     * @param file a scenario file (UTF-8)
     * @return the spec
     * @throws IOException              if the file cannot be read
     * @throws IllegalArgumentException if the content is invalid ("file:line: message")
     */
    public static ScenarioSpec read(Path file) throws IOException {
        return parse(Files.readString(file, StandardCharsets.UTF_8), file.toString());
    }

    /**
     * @param text   scenario file content
     * @param source name used in error messages (e.g. the file name)
     * @return the spec
     * @throws IllegalArgumentException if the content is invalid ("source:line: message")
     */
    public static ScenarioSpec parse(String text, String source) {
        Map<String, String> values = new LinkedHashMap<>();
        Map<String, Integer> lineOf = new LinkedHashMap<>();
        String[] lines = text.split("\r\n|\n|\r", -1);
        for (int i = 0; i < lines.length; i++) {
            String line = lines[i].strip();
            if (i == 0 && line.startsWith("\uFEFF")) {
                line = line.substring(1).strip();
            }
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            int eq = line.indexOf('=');
            if (eq < 0) {
                throw new IllegalArgumentException(source + ":" + (i + 1) + ": expected 'key = value', was '" + line
                        + "'");
            }
            String key = line.substring(0, eq).strip();
            String value = line.substring(eq + 1).strip();
            if (key.isEmpty()) {
                throw new IllegalArgumentException(source + ":" + (i + 1) + ": missing key before '='");
            }
            if (!known(key)) {
                throw new IllegalArgumentException(source + ":" + (i + 1) + ": unknown key '" + key
                        + "'; see docs/scenarios.md");
            }
            if (values.containsKey(key)) {
                throw new IllegalArgumentException(source + ":" + (i + 1) + ": key '" + key + "' repeats line "
                        + lineOf.get(key));
            }
            if (value.isEmpty()) {
                throw new IllegalArgumentException(source + ":" + (i + 1) + ": key '" + key + "' has no value");
            }
            values.put(key, value);
            lineOf.put(key, i + 1);
        }
        Reader r = new Reader(source, values, lineOf);
        TreeMap<String, Double> truths = new TreeMap<>();
        TreeMap<String, Double> settings = new TreeMap<>();
        TreeMap<String, String> options = new TreeMap<>();
        for (String k : values.keySet()) {
            if (TRUTH_KEYS.contains(k)) {
                truths.put(k, r.number(k));
            } else if (k.startsWith("truth.")) {
                put(r, k, truths, r.number(k), "truth");
            } else if (k.startsWith("setting.")) {
                put(r, k, settings, r.number(k), "setting");
            } else if (k.startsWith("option.")) {
                put(r, k, options, values.get(k), "option");
            } else if (k.equals("family")) {
                put(r, "option.family", options, values.get(k), "option");
            }
        }
        String name = r.required("name");
        Scenario scenario = r.wrap("name", () -> new Scenario(name, truths, settings, options));
        List<String> estimators = new ArrayList<>();
        for (String e : r.required("estimators").split(",")) {
            estimators.add(e.strip());
        }
        String[] sizeText = r.required("sizes").split(",");
        int[] sizes = new int[sizeText.length];
        for (int i = 0; i < sizes.length; i++) {
            sizes[i] = r.integer("sizes", sizeText[i].strip());
            if (sizes[i] < 1) {
                throw r.error("sizes", "sample sizes must be >= 1, had " + sizes[i]);
            }
        }
        if (Arrays.stream(sizes).distinct().count() != sizes.length) {
            throw r.error("sizes", "sample sizes must be distinct, were " + Arrays.toString(sizes));
        }
        int replicates = r.integer("replicates", r.required("replicates"));
        if (replicates < 1) {
            throw r.error("replicates", "replicates must be >= 1, was " + replicates);
        }
        long seed;
        try {
            seed = Long.parseLong(r.required("seed"));
        } catch (NumberFormatException e) {
            throw r.error("seed", "seed must be a decimal 64-bit integer, was '" + values.get("seed") + "'");
        }
        double level = values.containsKey("level") ? r.number("level") : 0.95;
        if (!(level > 0 && level < 1)) {
            throw r.error("level", "level must be in (0, 1), was " + level);
        }
        String generator = r.required("generator");
        r.wrap("generator", () -> {
            Scenario.requireName("generator name", generator);
            return null;
        });
        return r.wrap("estimators", () -> new ScenarioSpec(scenario, values.getOrDefault("description", ""),
                generator, estimators, sizes, replicates, seed, level));
    }

    private static <V> void put(Reader r, String key, Map<String, V> into, V value, String what) {
        String name = key.substring(key.indexOf('.') + 1);
        key = r.values().containsKey(key) ? key : name; // 'family' is short for 'option.family'
        r.wrap(key, () -> {
            Scenario.requireName(what + " name", name);
            return null;
        });
        if (into.containsKey(name)) {
            throw r.error(key, what + " '" + name + "' is given twice");
        }
        into.put(name, value);
    }

    private static boolean known(String key) {
        return switch (key) {
            case "name", "description", "generator", "estimators", "family", "mean", "sd", "p", "r", "fatality",
                 "sizes", "replicates", "seed", "level" -> true;
            default -> key.startsWith("truth.") || key.startsWith("setting.") || key.startsWith("option.");
        };
    }

    private record Reader(String source, Map<String, String> values, Map<String, Integer> lineOf) {

        String required(String key) {
            String v = values.get(key);
            if (v == null) {
                throw new IllegalArgumentException(source + ": required key '" + key + "' is missing");
            }
            return v;
        }

        double number(String key) {
            String v = values.get(key);
            double x;
            try {
                x = Double.parseDouble(v);
            } catch (NumberFormatException e) {
                throw error(key, "'" + key + "' must be a number, was '" + v + "'");
            }
            if (!Double.isFinite(x)) {
                throw error(key, "'" + key + "' must be finite, was '" + v + "'");
            }
            return x;
        }

        int integer(String key, String v) {
            try {
                return Integer.parseInt(v);
            } catch (NumberFormatException e) {
                throw error(key, "'" + key + "' must hold integers, had '" + v + "'");
            }
        }

        IllegalArgumentException error(String key, String message) {
            Integer line = lineOf.get(key);
            return new IllegalArgumentException(source + (line == null ? "" : ":" + line) + ": " + message);
        }

        <T> T wrap(String key, java.util.function.Supplier<T> s) {
            try {
                return s.get();
            } catch (IllegalArgumentException e) {
                throw error(key, e.getMessage());
            }
        }
    }
}
