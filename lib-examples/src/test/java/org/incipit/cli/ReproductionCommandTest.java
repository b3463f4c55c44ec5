package org.incipit.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import org.incipit.io.JsonOutput;
import org.junit.jupiter.api.Test;

/** End-to-end runs of {@code incipit reproduction}. */
class ReproductionCommandTest {

    // 97.5% standard normal quantile, scipy 1.17 norm.ppf(0.975)
    private static final double Z = 1.959963984540054;

    @Test
    void gammaClosedFormWithGrowthRateUncertainty() {
        // gamma(shape a, rate b): R = (1 + r/b)^a (Wallinga & Lipsitch 2007); mean 6, sd 3 gives
        // a = 4, b = 2/3. With only r uncertain the delta method on log R has slope a / (b + r).
        CliRun run = CliRun.of("reproduction", "--growth-rate", "0.1", "--growth-rate-ci", "0.08,0.12",
                "--family", "gamma", "--mean", "6", "--sd", "3", "--json");
        assertEquals(0, run.code(), run.err());
        JsonNode e = JsonOutput.read(run.out()).get("reproductionNumber");
        double a = 4;
        double b = 2.0 / 3;
        double r = 0.1;
        double rr = Math.pow(1 + r / b, a);
        assertEquals(rr, e.get("estimate").asDouble(), 1e-12 * rr);
        double se = 0.02 / Z * a / (b + r);
        // central differences (step 1e-5 relative) inside the estimator: agreement to ~1e-9
        assertEquals(rr * Math.exp(-Z * se), e.get("lower").asDouble(), 1e-8 * rr);
        assertEquals(rr * Math.exp(Z * se), e.get("upper").asDouble(), 1e-8 * rr);
        assertEquals("delta", e.get("method").asText());
    }

    @Test
    void meanAndSdUncertaintyWidenTheInterval() {
        JsonNode narrow = JsonOutput.read(CliRun.of("reproduction", "--growth-rate", "0.1", "--growth-rate-ci",
                "0.08,0.12", "--family", "gamma", "--mean", "6", "--sd", "3", "--json").out());
        CliRun run = CliRun.of("reproduction", "--growth-rate", "0.1", "--growth-rate-ci", "0.08,0.12",
                "--family", "gamma", "--mean", "6", "--sd", "3", "--mean-ci", "5,7", "--sd-ci", "2,4", "--json");
        assertEquals(0, run.code(), run.err());
        JsonNode wide = JsonOutput.read(run.out());
        double wn = narrow.at("/reproductionNumber/upper").asDouble() - narrow.at("/reproductionNumber/lower").asDouble();
        double ww = wide.at("/reproductionNumber/upper").asDouble() - wide.at("/reproductionNumber/lower").asDouble();
        assertTrue(ww > wn, ww + " > " + wn);
        // only the mean uncertain, r known: d log R / d mean at fixed sd, by hand for the gamma:
        // a = m^2/s^2, b = m/s^2, log R = a log(1 + r/b) (checked against central differences below)
        CliRun m = CliRun.of("reproduction", "--growth-rate", "0.1", "--family", "gamma", "--mean", "6", "--sd", "3",
                "--mean-ci", "5,7", "--json");
        JsonNode e = JsonOutput.read(m.out()).get("reproductionNumber");
        double h = 1e-6;
        double slope = (logR(6 + h, 3, 0.1) - logR(6 - h, 3, 0.1)) / (2 * h);
        double se = 1 / Z * slope;
        double rr = Math.exp(logR(6, 3, 0.1));
        assertEquals(rr * Math.exp(-Z * Math.abs(se)), e.get("lower").asDouble(), 1e-7 * rr);
        assertEquals(rr * Math.exp(Z * Math.abs(se)), e.get("upper").asDouble(), 1e-7 * rr);
    }

    private static double logR(double m, double s, double r) {
        double a = m * m / (s * s);
        double b = m / (s * s);
        return a * Math.log1p(r / b);
    }

    @Test
    void otherFamiliesAgreeWithNumericalEulerLotka() {
        // lognormal(meanlog, sdlog) with mean 6, sd 3: R = 1 / E[exp(-r G)], the expectation by
        // the trapezoid rule on a fine grid here (independent of the library's quadrature)
        double mu = Math.log(36 / Math.sqrt(45));
        double sigma = Math.sqrt(Math.log(1.25));
        double r = 0.1;
        double sum = 0;
        double dx = 1e-3;
        for (int i = 1; i < 200_000; i++) {
            double x = i * dx;
            double z = (Math.log(x) - mu) / sigma;
            sum += Math.exp(-r * x) * Math.exp(-0.5 * z * z) / (x * sigma * Math.sqrt(2 * Math.PI)) * dx;
        }
        CliRun run = CliRun.of("reproduction", "--growth-rate", "0.1", "--family", "lognormal", "--mean", "6",
                "--sd", "3", "--json");
        assertEquals(0, run.code(), run.err());
        JsonNode j = JsonOutput.read(run.out());
        assertEquals(1 / sum, j.at("/reproductionNumber/estimate").asDouble(), 1e-6);
        assertEquals("none given", j.get("uncertainty").asText());
        assertEquals(j.at("/reproductionNumber/estimate").asDouble(), j.at("/reproductionNumber/lower").asDouble());
        assertTrue(j.at("/generationInterval/parameters").has("meanlog"));
        assertTrue(j.at("/generationInterval/parameters").has("sdlog"));
    }

    @Test
    void badInputs() {
        CliRun run = CliRun.of("reproduction", "--growth-rate", "-0.1", "--family", "lognormal", "--mean", "6",
                "--sd", "3");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertTrue(run.err().startsWith("incipit: the Euler-Lotka equation has no solution for growth rate -0.1 "
                + "with a lognormal generation interval"), run.err());
        run = CliRun.of("reproduction", "--growth-rate", "0.1", "--growth-rate-ci", "0.12,0.2", "--family", "gamma",
                "--mean", "6", "--sd", "3");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertEquals("incipit: --growth-rate-ci [0.12, 0.2] must contain the estimate 0.1" + CliRun.NL, run.err());
        run = CliRun.of("reproduction", "--growth-rate", "0.1", "--growth-rate-ci", "0.12", "--family", "gamma",
                "--mean", "6", "--sd", "3");
        assertEquals("incipit: --growth-rate-ci must be LO,HI with finite numbers LO <= HI, was '0.12'" + CliRun.NL,
                run.err());
        run = CliRun.of("reproduction", "--growth-rate", "0.1", "--family", "gamma", "--mean", "6", "--sd", "-3");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertEquals("incipit: --sd must be finite and > 0, was -3.0" + CliRun.NL, run.err());
        run = CliRun.of("reproduction", "--growth-rate", "0.1", "--family", "normal", "--mean", "6", "--sd", "3");
        assertEquals(ExitCode.BAD_INPUT, run.code());
        assertEquals("incipit: family must be one of gamma, weibull, lognormal, was normal" + CliRun.NL, run.err());
    }
}
