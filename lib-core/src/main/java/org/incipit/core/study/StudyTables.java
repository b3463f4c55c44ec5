package org.incipit.core.study;

import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Study summaries as text tables: CSV for machines, Markdown for people.
 *
 * <p>CSV (RFC 4180 quoting): a header line, one line per summary, lines ended by
 * {@code \n}; a field holding a comma, a double quote, CR or LF is quoted and its double
 * quotes doubled. Numbers are written with {@link Double#toString(double)} (round-trip exact),
 * NaN as {@code NA} and infinities as {@code Inf} / {@code -Inf} (read as such by R and
 * pandas). Failure reasons are one field, {@code reason (count)} joined by {@code "; "}.
 */
public final class StudyTables {

    /** The CSV header columns, in order. */
    public static final List<String> CSV_COLUMNS = List.of("estimator", "target", "n", "truth", "level",
            "replicates", "successes", "failures", "failure_rate", "mean", "bias", "bias_se", "relative_bias",
            "rmse", "empirical_sd", "covered", "coverage", "coverage_se", "coverage_lower", "coverage_upper",
            "mean_width", "median_width", "unbounded", "failure_reasons");

    private StudyTables() {
    }

    /**
     * @param rows summaries, in output order
     * @return the CSV text (header first, every line ended by {@code \n})
     */
    public static String csv(List<StudySummary> rows) {
        StringBuilder b = new StringBuilder();
        b.append(String.join(",", CSV_COLUMNS)).append('\n');
        for (StudySummary s : rows) {
            Object[] f = {s.estimator(), s.target(), s.sampleSize(), s.truth(), s.level(), s.replicates(),
                s.successes(), s.failures(), s.failureRate(), s.meanEstimate(), s.bias(), s.biasStandardError(),
                s.relativeBias(), s.rmse(), s.empiricalSd(), s.covered(), s.coverage(), s.coverageStandardError(),
                s.coverageLower(), s.coverageUpper(), s.meanWidth(), s.medianWidth(), s.unboundedIntervals(),
                reasons(s.failureReasons())};
            for (int i = 0; i < f.length; i++) {
                if (i > 0) {
                    b.append(',');
                }
                b.append(csvField(f[i] instanceof Double d ? csvNumber(d) : String.valueOf(f[i])));
            }
            b.append('\n');
        }
        return b.toString();
    }

    /**
     * A Markdown (GitHub) table of the main measures, numbers to 4 significant digits, followed
     * by a list of the failure reasons when there are any. Pipes in names and reasons are escaped
     * and line breaks replaced by spaces.
     *
     * @param rows summaries, in output order
     * @return the Markdown text, lines ended by {@code \n}
     */
    public static String markdown(List<StudySummary> rows) {
        StringBuilder b = new StringBuilder();
        b.append("| estimator | target | n | truth | mean | bias (MC SE) | rel. bias | RMSE | emp. SD "
                + "| coverage (SE) | coverage 95% CI | mean width | median width | failures |\n");
        b.append("|---|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|\n");
        boolean anyFailure = false;
        for (StudySummary s : rows) {
            anyFailure |= s.failures() > 0;
            b.append("| ").append(md(s.estimator()))
                    .append(" | ").append(md(s.target()))
                    .append(" | ").append(s.sampleSize())
                    .append(" | ").append(num(s.truth()))
                    .append(" | ").append(num(s.meanEstimate()))
                    .append(" | ").append(num(s.bias())).append(" (").append(num(s.biasStandardError())).append(')')
                    .append(" | ").append(num(s.relativeBias()))
                    .append(" | ").append(num(s.rmse()))
                    .append(" | ").append(num(s.empiricalSd()))
                    .append(" | ").append(num(s.coverage())).append(" (").append(num(s.coverageStandardError()))
                    .append(')')
                    .append(" | ").append(num(s.coverageLower())).append("–").append(num(s.coverageUpper()))
                    .append(" | ").append(num(s.meanWidth()))
                    .append(" | ").append(num(s.medianWidth()))
                    .append(" | ").append(s.failures()).append('/').append(s.replicates())
                    .append(" |\n");
        }
        if (anyFailure) {
            b.append("\nFailures:\n\n");
            for (StudySummary s : rows) {
                for (Map.Entry<String, Integer> e : s.failureReasons().entrySet()) {
                    b.append("- ").append(md(s.estimator())).append(", ").append(md(s.target())).append(", n = ")
                            .append(s.sampleSize()).append(": ").append(e.getValue()).append(" × ")
                            .append(md(e.getKey())).append('\n');
                }
            }
        }
        return b.toString();
    }

    static String csvNumber(double v) {
        if (Double.isNaN(v)) {
            return "NA";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "Inf" : "-Inf";
        }
        return Double.toString(v);
    }

    static String csvField(String s) {
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.indexOf('\n') < 0 && s.indexOf('\r') < 0) {
            return s;
        }
        return '"' + s.replace("\"", "\"\"") + '"';
    }

    private static String reasons(Map<String, Integer> r) {
        StringBuilder b = new StringBuilder();
        for (Map.Entry<String, Integer> e : r.entrySet()) {
            if (b.length() > 0) {
                b.append("; ");
            }
            b.append(e.getKey()).append(" (").append(e.getValue()).append(')');
        }
        return b.toString();
    }

    /**
     * @param v a number
     * @return 4 significant digits, "NA" for NaN, "Inf" / "-Inf" for infinities
     */
    static String num(double v) {
        if (Double.isNaN(v)) {
            return "NA";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "Inf" : "-Inf";
        }
        return String.format(Locale.ROOT, "%.4g", v);
    }

    private static String md(String s) {
        return s.replace("\\", "\\\\").replace("|", "\\|").replace("\r\n", " ").replace('\n', ' ').replace('\r', ' ');
    }
}
