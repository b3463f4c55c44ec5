package org.incipit.benchmarks;

import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import org.incipit.core.estimate.ambiguous.AmbiguousStartEstimator;
import org.incipit.core.estimate.ambiguous.ExposureHistory;
import org.incipit.core.likelihood.LogLikelihood;
import org.incipit.core.likelihood.Maximiser;
import org.incipit.core.likelihood.Optimum;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.distributions.DelayFamilies;

/**
 * The Java side of the scipy comparison (benchmarks/compare_scipy.sh): reads the CSV files that
 * {@code scipy_ambiguous_gamma.py generate} writes (case,end,start), and maximises the open
 * ambiguous-start gamma log-likelihood from the script's start (shape 1, rate 1, p 0.3, i.e.
 * unconstrained (0, 0, logit 0.3)) with the engine's Newton and BFGS maximisers. {@code main}
 * prints one line per file and method:
 * {@code JAVA file=F method=M n=N candidates=C loglik=L shape=A rate=B p=P iterations=I converged=T}.
 * Warm timings are taken by {@link ScipyComparisonBenchmarks}.
 */
public final class ScipyComparison {

    /** Unconstrained start: log 1, log 1, logit 0.3. */
    static final double[] START = {0, 0, Math.log(0.3 / 0.7)};

    private ScipyComparison() {
    }

    /**
     * Reads a case,end,start CSV (header line first; candidates of a case on consecutive rows).
     *
     * @param file the file
     * @return the cases
     * @throws IOException if it cannot be read
     */
    static AmbiguousStartCases read(Path file) throws IOException {
        AmbiguousStartCases.Builder b = AmbiguousStartCases.builder();
        try (BufferedReader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            String line = r.readLine();
            if (line == null || !line.strip().equals("case,end,start")) {
                throw new IOException(file + ": expected header case,end,start, was " + line);
            }
            String current = null;
            double end = 0;
            List<Double> starts = new ArrayList<>();
            while ((line = r.readLine()) != null) {
                if (line.isBlank()) {
                    continue;
                }
                String[] f = line.split(",");
                if (!f[0].equals(current)) {
                    if (current != null) {
                        b.addCase(current, end, starts.stream().mapToDouble(Double::doubleValue).toArray());
                    }
                    current = f[0];
                    end = Double.parseDouble(f[1]);
                    starts.clear();
                }
                starts.add(Double.parseDouble(f[2]));
            }
            if (current != null) {
                b.addCase(current, end, starts.stream().mapToDouble(Double::doubleValue).toArray());
            }
        }
        return b.build();
    }

    /** @return the open gamma log-likelihood of the cases */
    static LogLikelihood likelihood(AmbiguousStartCases cases) {
        return AmbiguousStartEstimator.logLikelihood(cases, DelayFamilies.GAMMA, ExposureHistory.open());
    }

    /**
     * @param args data files written by {@code scipy_ambiguous_gamma.py generate}
     * @throws IOException if a file cannot be read
     */
    public static void main(String[] args) throws IOException {
        for (String a : args) {
            AmbiguousStartCases c = read(Path.of(a));
            LogLikelihood ll = likelihood(c);
            for (String m : List.of("newton", "bfgs")) {
                Maximiser mx = m.equals("newton") ? Maximiser.newton() : Maximiser.bfgs();
                Optimum o = mx.maximise(ll, START.clone());
                double[] t = o.argmax();
                System.out.println(String.format(Locale.ROOT, "JAVA file=%s method=%s n=%d candidates=%d loglik=%.10f"
                        + " shape=%.8f rate=%.8f p=%.8f iterations=%d converged=%s", a, m, c.caseCount(),
                        c.candidateCount(), o.value(), Math.exp(t[0]), Math.exp(t[1]), 1 / (1 + Math.exp(-t[2])),
                        o.iterations(), o.converged()));
            }
        }
    }
}
