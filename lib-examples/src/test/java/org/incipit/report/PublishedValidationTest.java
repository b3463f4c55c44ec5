package org.incipit.report;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.ForkJoinPool;

import org.incipit.core.study.ScenarioSpec;
import org.incipit.core.study.Study;
import org.incipit.core.study.StudyListener;
import org.incipit.core.study.StudyRegistry;
import org.incipit.core.study.StudyResult;
import org.incipit.core.study.StudySummary;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * The published validation: runs the shipped scenarios of every registered outbreak estimator
 * through the study harness, writes {@code docs/validation.md} with one PNG per scenario under
 * {@code docs/validation/}, and asserts what the methods promise. Runs only with
 * {@code mvn -Pvalidation verify} (tag "validation").
 *
 * <p>Targets at n = 500 (common practice for a 95% interval checked with 1000 replicates):
 * |relative bias| &lt; 2% and coverage in [0.935, 0.965] (about &plusmn;2.2 binomial SE of 0.0069).
 * Asserted only where the method is expected to meet them (maximum likelihood of the mean and p
 * under the matching exposure history; growth-rate regression with the right count model;
 * Euler&ndash;Lotka with a known generation interval), with the wider acceptance band
 * [0.93, 0.97] (&plusmn;2.9 SE, about 0.4% false alarms per check at exact coverage,
 * scipy.stats.binom 1.17: P(X &le; 929) + P(X &ge; 971) for Binomial(1000, 0.95)). The naive
 * rules are asserted to be biased by more than 5%: that is their point.
 */
@Tag("validation")
class PublishedValidationTest {

    /** Shipped scenario names, in document order. */
    static final List<String> SCENARIOS = List.of("ambiguous-open-gamma", "ambiguous-open-weibull",
            "ambiguous-open-lognormal", "ambiguous-known-total-gamma", "ambiguous-poisson-total-gamma",
            "ambiguous-complete-gamma",
            "ambiguous-open-gamma-em", "growth-poisson", "growth-negative-binomial", "euler-lotka",
            "delays-truncated-lognormal", "delays-truncated-daily-lognormal", "delays-censored-lognormal",
            "delays-truncated-gamma", "delays-truncated-daily-gamma", "delays-censored-gamma",
            "incubation-uniform-lognormal", "incubation-growing-lognormal", "backward-intervals-gamma",
            "fatality-growing");

    /** Estimators that are biased by construction under their scenario, shown for contrast. */
    static final List<String> NAIVE = List.of("delays-truncated-lognormal/delay-observed-only",
            "delays-truncated-daily-lognormal/delay-observed-only", "delays-censored-lognormal/delay-observed-only",
            "delays-truncated-gamma/delay-observed-only", "delays-truncated-daily-gamma/delay-observed-only",
            "delays-censored-gamma/delay-observed-only",
            "incubation-growing-lognormal/incubation-uniform", "backward-intervals-gamma/interval-backward-naive",
            "backward-intervals-gamma/backward-R-naive", "fatality-growing/fatality-crude");

    /** Why an estimator is expected to miss a target, from its method (used only where it misses). */
    static final Map<String, String> WHY = new LinkedHashMap<>();

    static {
        WHY.put("naive-latest", "the latest candidate is at or after the infecting one, so its duration is too"
                + " short (docs/methods.md section 1); biased by construction, shown for contrast.");
        WHY.put("naive-earliest", "the earliest candidate adds the waiting time before infection, so its duration"
                + " is too long; biased by construction, shown for contrast.");
        WHY.put("naive-midpoint", "the midpoint of the first and last candidates has no reason to match the"
                + " infecting one; biased by construction, shown for contrast.");
        WHY.put("naive-single-only", "single-candidate cases are those with no exposure between infection and"
                + " onset, probability p e^(-lambda X): short intervals are over-represented; biased by"
                + " construction, shown for contrast.");
        WHY.put("delay-observed-only", "fits the observed pairs as if complete: during growth the recent"
                + " primaries, whose long delays are not yet seen (truncated) or not yet over (censored), make the"
                + " delays look short; biased by construction, shown for contrast.");
        WHY.put("incubation-growing-lognormal/incubation-uniform", "assumes infection uniform in the exposure"
                + " window while during growth later exposures are more likely, so it places infection too early"
                + " and overstates the incubation period; biased by construction, shown for contrast.");
        WHY.put("interval-backward-naive", "backward-traced intervals are the intrinsic ones tilted by e^(-r x)"
                + " (docs/methods.md section 3), so taken as intrinsic they are too short; biased by construction.");
        WHY.put("backward-R-naive", "R from the tilted interval used as if intrinsic, M_g(-r)/M_g(-2r), is below"
                + " the true 1/M_g(-r) (Cauchy-Schwarz); biased by construction, shown for contrast.");
        WHY.put("fatality-crude", "deaths lag onsets by about 15 days, so during growth many recent cases have"
                + " not yet had time to die: deaths/cases tends to p M_f(-r), below p (docs/methods.md section 5);"
                + " biased by construction, shown for contrast.");
        WHY.put("fatality-window-adjusted", "few deaths at this n (about 6 deaths by the last day at"
                + " n = 500, as only about a quarter of the cases have had time to die; M_f(-r) = 0.26):"
                + " the binomial likelihood-ratio interval on a small count is discrete, so its coverage"
                + " oscillates around the nominal level.");
        WHY.put("ambiguous-moments", "percentile bootstrap intervals of a moment estimator whose variance"
                + " equation subtracts two noisy terms: its sampling distribution is skewed and wide at n = 500,"
                + " and replicates whose variance solves to <= 0 fail (counted), which removes the low tail and"
                + " shifts the surviving estimates.");
        WHY.put("ambiguous-em", "the unpenalised histogram NPMLE puts spurious mass at long durations (the"
                + " earliest candidates of cases with many exposures), overstating the mean and more the sd at"
                + " small n (see AmbiguousStartEm); the bias dwarfs the interval width, so coverage collapses. Each"
                + " replicate runs EM 51 times (50 bootstrap refits), so fewer replicates were affordable; a"
                + " replicate fails when the bootstrap distribution is so biased that the percentile interval"
                + " excludes the estimate.");
        WHY.put("growth-poisson/growth-nb", "on Poisson counts the negative-binomial dispersion k has no finite maximum"
                + " (no overdispersion) in a large share of data sets; those replicates are refused and counted"
                + " as failures rather than reported with an infinite k.");
        WHY.put("growth-negative-binomial/growth-nb", "the dispersion k is estimated from 30 days of small counts"
                + " (about 3 a day at first for n = 500); its maximum-likelihood estimate is biased upwards in small"
                + " samples (common practice; e.g. Lloyd-Smith 2007, PLoS ONE 2:e180, from memory), so the fitted"
                + " variance is too small and the profile interval of r slightly too narrow. A few fits stop with k"
                + " not converged or with no overdispersion in the sample; they are refused and counted.");
        WHY.put("growth-negative-binomial/growth-poisson", "on overdispersed (negative binomial, k = 10) counts the Poisson model"
                + " ignores the extra variance, so its profile interval is too narrow.");
        WHY.put("ambiguous-known-total-gamma/ambiguous-ml-gamma", "the interval of p is a Wald interval on the"
                + " logit scale from the observed information; with M = 5 exposures per person much of the"
                + " information about p comes through the normaliser 1 - (1 - p)^M, and the log-likelihood is not"
                + " yet quadratic in logit p at n = 500, so the interval is somewhat too wide (conservative). The"
                + " larger sizes show whether the excess shrinks with n, as this explanation predicts.");
        WHY.put("ambiguous-ml-gamma", "Wald/delta-method interval on the log scale of a quantity whose"
                + " sampling distribution is still skewed at this n.");
        WHY.put("ambiguous-ml-weibull", WHY.get("ambiguous-ml-gamma"));
        WHY.put("ambiguous-ml-lognormal", WHY.get("ambiguous-ml-gamma"));
        WHY.put("euler-lotka-known-gi", "Wald interval of r mapped through R(r); with few cases the Poisson"
                + " regression's Wald interval is slightly anti-conservative.");
        WHY.put("euler-lotka-estimated-gi", "delta method on log R with a generation interval fitted to 100"
                + " pairs: the uncertainty of the interval's parameters adds a skewed component.");
    }

    record Run(ScenarioSpec spec, StudyResult result, double seconds) {
    }

    @Test
    void publishedValidation() throws IOException {
        Path root = Path.of("..").toAbsolutePath().normalize();
        assertTrue(Files.exists(root.resolve("pom.xml")) && Files.isDirectory(root.resolve("docs")),
                "run from lib-examples: " + root);
        Path docs = root.resolve("docs");
        Path pngDir = docs.resolve("validation");
        Files.createDirectories(pngDir);
        int threads = Math.max(1, Runtime.getRuntime().availableProcessors());
        ForkJoinPool pool = new ForkJoinPool(threads);
        List<Run> runs = new ArrayList<>();
        try {
            for (String name : SCENARIOS) {
                ScenarioSpec spec = shipped(name);
                Study<?> study = StudyRegistry.standard().study(spec);
                long t0 = System.nanoTime();
                StudyResult r = study.run(pool, StudyListener.NONE);
                runs.add(new Run(spec, r, (System.nanoTime() - t0) / 1e9));
                Charts.studySummary(pngDir.resolve(name + ".png"), name + " (" + spec.replicates()
                        + " replicates per n)", r.summaries());
            }
        } finally {
            pool.shutdown();
        }
        Files.writeString(docs.resolve("validation.md"), document(runs, threads), StandardCharsets.UTF_8);
        check(runs);
    }

    /** The assertions: see the class description. */
    static void check(List<Run> runs) {
        for (Run run : runs) {
            String sc = run.spec().scenario().name();
            for (StudySummary s : run.result().summaries()) {
                if (s.sampleSize() != 500) {
                    continue;
                }
                String e = s.estimator();
                String what = sc + " / " + e + " / " + s.target() + " at n = 500: ";
                if (e.startsWith("naive-")) {
                    assertTrue(Math.abs(s.relativeBias()) > 0.05, what + "naive rule should be biased, relative bias "
                            + s.relativeBias());
                    continue;
                }
                if (NAIVE.contains(sc + "/" + e) && !s.target().equals("sd")) {
                    // the sd is not always what a naive rule gets wrong (a uniform exposure model
                    // shifts the incubation period, it hardly changes its spread), so only the
                    // location targets (mean, R, fatality) are asserted
                    // biased by construction: the bias is detectable, more than 4 Monte Carlo SE
                    assertTrue(Math.abs(s.bias()) > 4 * s.biasStandardError(), what + "expected a bias, had "
                            + s.bias() + " (MC SE " + s.biasStandardError() + ")");
                    continue;
                }
                if (sc.equals("growth-negative-binomial") && e.equals("growth-nb")) {
                    // bias target only: its coverage is about 0.93 in both runs made (explained in the
                    // document: the dispersion k is overestimated from small counts)
                    assertTrue(Math.abs(s.relativeBias()) < 0.02, what + "relative bias " + s.relativeBias());
                    assertTrue(s.failureRate() <= 0.01, what + "failures " + s.failureReasons());
                    continue;
                }
                if (expectedToMeetTargets(sc, e, s.target())) {
                    assertTrue(s.failureRate() <= 0.01, what + "failures " + s.failureReasons());
                    assertTrue(Math.abs(s.relativeBias()) < 0.02, what + "relative bias " + s.relativeBias());
                    assertTrue(s.coverage() >= 0.93 && s.coverage() <= 0.97, what + "coverage " + s.coverage());
                }
            }
        }
    }

    static boolean expectedToMeetTargets(String scenario, String estimator, String target) {
        if (estimator.startsWith("ambiguous-ml-")) {
            return target.equals("mean") || target.equals("p");
        }
        return scenario.equals("growth-poisson") && estimator.equals("growth-poisson")
                || estimator.equals("euler-lotka-known-gi")
                || List.of("delay-truncated", "delay-censored", "interval-growth-weighted", "backward-R-corrected",
                        "incubation-interval-censored").contains(estimator)
                || scenario.equals("incubation-uniform-lognormal") && estimator.equals("incubation-uniform")
                || scenario.equals("incubation-growing-lognormal") && estimator.equals("incubation-growing");
    }

    static boolean meets(StudySummary s) {
        return s.successes() > 0 && Math.abs(s.relativeBias()) < 0.02 && s.coverage() >= 0.935
                && s.coverage() <= 0.965;
    }

    static ScenarioSpec shipped(String name) throws IOException {
        String resource = "/org/incipit/scenarios/" + name + ".scenario";
        try (InputStream in = PublishedValidationTest.class.getResourceAsStream(resource)) {
            assertTrue(in != null, "missing " + resource);
            return ScenarioSpec.parse(new String(in.readAllBytes(), StandardCharsets.UTF_8), name);
        }
    }

    static String document(List<Run> runs, int threads) {
        StringBuilder d = new StringBuilder();
        d.append("# Validation of the estimators by simulation\n\n");
        d.append("Generated by `PublishedValidationTest` (lib-examples, `mvn -Pvalidation verify`); do not edit by"
                + " hand. Every number below comes from the shipped scenario files in"
                + " `lib-examples/src/main/resources/org/incipit/scenarios/` (run any of them with"
                + " `./incipit study --scenario NAME`), simulated by the library's own generators from fixed"
                + " seeds, in invented scenarios. Definitions of the measures: Morris, White & Crowther 2019,"
                + " Statistics in Medicine 38:2074 (bias with its Monte Carlo SE, relative bias = bias / truth,"
                + " RMSE, coverage of the nominal 95% interval with its binomial SE, mean interval width, failure"
                + " rate = replicates with no estimate).\n\n");
        d.append("**Targets at n = 500**: |relative bias| < 2% and coverage within 93.5–96.5%. A row marked"
                + " *missed* does not meet them; the reason, from the method, is given under its table. The"
                + " naive rules for ambiguous starts are meant to miss: they are shown so that the size of the"
                + " bias the corrected estimators remove can be seen.\n\n");
        d.append("Sample size n: cases (ambiguous starts); expected total count over the 30-day window (growth"
                + " rate and R); pairs (delays; for censored delays, primaries); exposure windows (incubation);"
                + " backward-traced intervals; expected total cases over 40 days (fatality).\n\n");
        d.append("Asserted by the test at n = 500 (acceptance band 93–97%, failure rate at most 1%): maximum"
                + " likelihood of the mean and p for ambiguous starts under the matching exposure history; growth"
                + " rate with the right count model (the negative-binomial fit: bias only, see its section); Euler–Lotka R with a known interval; truncated and censored"
                + " delays; incubation under the right window model; growth-weighted intervals and R. Estimators"
                + " biased by construction are asserted to show a bias of more than 4 Monte Carlo SE.\n\n");
        d.append("| scenario | replicates per n | sizes | seed | wall time (s, ").append(threads)
                .append(" threads, shared machine) |\n|---|---|---|---|---|\n");
        for (Run r : runs) {
            d.append("| ").append(r.spec().scenario().name()).append(" | ").append(r.spec().replicates())
                    .append(" | ").append(java.util.Arrays.toString(r.spec().sampleSizes())).append(" | ")
                    .append(r.spec().seed()).append(" | ").append(String.format(Locale.ROOT, "%.0f", r.seconds()))
                    .append(" |\n");
        }
        d.append("\n## Summary at n = 500\n\n| scenario | estimator | target | relative bias | coverage (± SE) |"
                + " failure rate | meets targets |\n|---|---|---|---|---|---|---|\n");
        for (Run r : runs) {
            for (StudySummary s : r.result().summaries()) {
                if (s.sampleSize() == 500) {
                    d.append(String.format(Locale.ROOT, "| %s | %s | %s | %s | %s | %.3f | %s |%n",
                            r.spec().scenario().name(), s.estimator(), s.target(), pct(s.relativeBias()),
                            cov(s), s.failureRate(), meets(s) ? "yes" : "*missed*"));
                }
            }
        }
        for (Run r : runs) {
            String name = r.spec().scenario().name();
            d.append("\n## ").append(name).append("\n\n").append(r.spec().description()).append(". True values ")
                    .append(r.spec().scenario().truths()).append("; settings ").append(r.spec().scenario().settings())
                    .append("; options ").append(r.spec().scenario().options()).append(".\n\n");
            d.append("| estimator | target | n | truth | mean estimate | bias (MC SE) | relative bias | RMSE |"
                    + " coverage (± SE) | mean width | failure rate |\n|---|---|---|---|---|---|---|---|---|---|---|\n");
            List<String> missed = new ArrayList<>();
            for (StudySummary s : r.result().summaries()) {
                d.append(String.format(Locale.ROOT, "| %s | %s | %d | %.4g | %s | %s | %s | %s | %s | %s | %.3f |%n",
                        s.estimator(), s.target(), s.sampleSize(), s.truth(), num(s.meanEstimate()),
                        s.successes() > 1 ? num(s.bias()) + " (" + num(s.biasStandardError()) + ")" : "–",
                        pct(s.relativeBias()), num(s.rmse()), cov(s), num(s.meanWidth()), s.failureRate()));
                if (s.sampleSize() == 500 && !meets(s) && !missed.contains(s.estimator())) {
                    missed.add(s.estimator());
                }
            }
            d.append("\n![").append(name).append("](validation/").append(name).append(".png)\n");
            for (String e : missed) {
                d.append("\n*").append(e).append(" misses the n = 500 targets*: ")
                        .append(WHY.getOrDefault(name + "/" + e, WHY.getOrDefault(e,
                                "no explanation recorded; investigate."))).append('\n');
            }
            List<String> seen = new ArrayList<>();
            for (StudySummary s : r.result().summaries()) {
                if (s.sampleSize() == 500 && !s.failureReasons().isEmpty() && !seen.contains(s.estimator())) {
                    seen.add(s.estimator());
                    d.append("\nFailures of ").append(s.estimator()).append(" at n = 500: ").append(s.failures())
                            .append(" of ").append(s.replicates()).append(" replicates, by reason:\n");
                    Map<String, Integer> grouped = new java.util.TreeMap<>();
                    for (Map.Entry<String, Integer> f : s.failureReasons().entrySet()) {
                        // group reasons that differ only in their numbers
                        grouped.merge(f.getKey().replaceAll("-?[0-9][0-9.eE+-]*", "#"), f.getValue(), Integer::sum);
                    }
                    for (Map.Entry<String, Integer> f : grouped.entrySet()) {
                        String reason = f.getKey();
                        d.append("- ").append(f.getValue()).append(" × \"")
                                .append(reason.length() > 240 ? reason.substring(0, 240) + "…" : reason)
                                .append("\" (numbers shown as #)\n");
                    }
                }
            }
        }
        d.append("\n## Not covered here\n\n"
                + "- The nonparametric EM estimator at 1000 replicates: each replicate costs 51 EM runs; the"
                + " replicate count used is in the table at the top.\n");
        d.append("\n*Caution: model-based estimates from early, sparse data inform but do not replace the judgement"
                + " of the responsible public-health authority.*\n");
        return d.toString();
    }

    private static String num(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%.4g", v) : "–";
    }

    private static String pct(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%+.2f%%", 100 * v) : "–";
    }

    private static String cov(StudySummary s) {
        return s.successes() > 0 ? String.format(Locale.ROOT, "%.3f (%.3f)", s.coverage(), s.coverageStandardError())
                : "–";
    }
}
