package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import org.apache.commons.statistics.distribution.NormalDistribution;
import org.incipit.core.growth.EulerLotka;
import org.incipit.core.inference.Estimate;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;
import org.incipit.io.JsonOutput;
import org.incipit.io.TextTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code incipit reproduction}: reproduction number from a growth rate and a generation
 * interval by the Euler&ndash;Lotka equation R = 1 / M<sub>g</sub>(&minus;r) (Wallinga &amp;
 * Lipsitch 2007), with a delta-method interval from the uncertainty of r and of the interval's
 * mean and sd when given.
 */
@Command(name = "reproduction",
        mixinStandardHelpOptions = true,
        description = {"Reproduction number from a growth rate (Euler-Lotka equation).",
            "The generation interval is given by family, mean and sd.", ""},
        footer = {"",
            "R = 1 / E[exp(-r G)] for the generation interval G (Wallinga and Lipsitch",
            "2007). Interval: delta method on log R, from --growth-rate-ci and, when",
            "given, --mean-ci and --sd-ci (taken as independent normal uncertainties",
            "of the mean and sd). Assumes steady exponential growth and that G is the",
            "intrinsic (forward) generation interval, not one traced back from cases."})
public final class ReproductionCommand extends AbstractCommand {

    @Option(names = "--growth-rate", required = true, paramLabel = "R", description = "Growth rate r per day.")
    double rate;

    @Option(names = "--growth-rate-ci", paramLabel = "LO,HI", description = "Interval of r at --level.")
    String rateCi;

    @Option(names = "--family", required = true, paramLabel = "FAMILY",
            description = "Generation interval family: gamma, weibull or lognormal.")
    String family;

    @Option(names = "--mean", required = true, paramLabel = "DAYS", description = "Generation interval mean.")
    double mean;

    @Option(names = "--sd", required = true, paramLabel = "DAYS", description = "Generation interval sd.")
    double sd;

    @Option(names = "--mean-ci", paramLabel = "LO,HI", description = "Interval of the mean at --level.")
    String meanCi;

    @Option(names = "--sd-ci", paramLabel = "LO,HI", description = "Interval of the sd at --level.")
    String sdCi;

    @Option(names = "--level", paramLabel = "LEVEL", defaultValue = "0.95",
            description = "Level of the given intervals and of the result (default ${DEFAULT-VALUE}).")
    double level;

    /** Creates the command. */
    public ReproductionCommand() {
    }

    @Override
    protected int run() {
        Cli.level(level);
        if (!Double.isFinite(rate)) {
            throw new IllegalArgumentException("--growth-rate must be finite, was " + rate);
        }
        DelayFamily fam = DelayFamilies.byName(family);
        ParametricDelay g = fam.ofMeanSd(Cli.positive("--mean", mean), Cli.positive("--sd", sd));
        double[] rci = rateCi == null ? new double[] {rate, rate} : Cli.pair("--growth-rate-ci", rateCi);
        double[] mci = meanCi == null ? new double[] {mean, mean} : Cli.pair("--mean-ci", meanCi);
        double[] sci = sdCi == null ? new double[] {sd, sd} : Cli.pair("--sd-ci", sdCi);
        check("--growth-rate-ci", rate, rci);
        check("--mean-ci", mean, mci);
        check("--sd-ci", sd, sci);
        if (!(g.laplaceTransform(rci[0]) < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("the Euler-Lotka equation has no solution for growth rate " + rci[0]
                    + " with a " + fam.name() + " generation interval (E[exp(-r G)] is infinite for r <= "
                    + g.laplaceAbscissa() + ")");
        }
        Estimate r = reproduction(g, new Estimate(rate, rci[0], rci[1], level, "given"), mci, sci);
        ObjectNode json = JsonOutput.object();
        json.set("reproductionNumber", JsonOutput.estimate(r));
        ObjectNode in = json.putObject("growthRate");
        in.put("estimate", rate);
        in.put("lower", rci[0]);
        in.put("upper", rci[1]);
        ObjectNode gi = json.putObject("generationInterval");
        gi.put("family", fam.name());
        ObjectNode p = gi.putObject("parameters");
        List<String> names = fam.parameterNames();
        for (int i = 0; i < names.size(); i++) {
            p.put(names.get(i).toLowerCase(java.util.Locale.ROOT), g.parameters()[i]);
        }
        gi.put("mean", mean);
        gi.put("sd", sd);
        boolean uncertain = rateCi != null || meanCi != null || sdCi != null;
        json.put("uncertainty", uncertain ? "delta method from the intervals given" : "none given");
        TextTable t = TextTable.of("quantity", "estimate", "interval")
                .row("reproduction number R", Cli.cell(r), uncertain ? Cli.interval(r) : "none given")
                .row("growth rate (per day)", TextTable.number(rate),
                        rateCi == null ? "" : TextTable.number(rci[0]) + " to " + TextTable.number(rci[1]))
                .row("generation interval", fam.name() + ", mean " + TextTable.number(mean) + ", sd "
                        + TextTable.number(sd), "");
        emit(json, t);
        return ExitCode.OK;
    }

    private static void check(String option, double x, double[] ci) {
        if (!(ci[0] <= x && x <= ci[1])) {
            throw new IllegalArgumentException(option + " [" + ci[0] + ", " + ci[1] + "] must contain the estimate "
                    + x);
        }
    }

    /**
     * R with a delta-method interval; the covariance of the interval's natural parameters is
     * mapped from independent normal uncertainties of its mean and sd (standard errors =
     * interval width / 2z) by the Jacobian of (mean, sd) -> parameters (central differences).
     */
    static Estimate reproduction(ParametricDelay g, Estimate rate, double[] meanCi, double[] sdCi) {
        double z = NormalDistribution.of(0, 1).inverseCumulativeProbability(0.5 + rate.level() / 2);
        double seMean = (meanCi[1] - meanCi[0]) / (2 * z);
        double seSd = (sdCi[1] - sdCi[0]) / (2 * z);
        double[][] cov = covariance(g, seMean, seSd);
        if (rate.lower() == rate.upper() && seMean == 0 && seSd == 0) {
            double r = EulerLotka.reproductionNumber(g, rate.estimate());
            return new Estimate(r, r, r, rate.level(), "none");
        }
        return EulerLotka.reproductionNumberDelta(g, cov, rate);
    }

    static double[][] covariance(ParametricDelay g, double seMean, double seSd) {
        DelayFamily fam = g.family();
        int k = g.parameters().length;
        double m = g.mean();
        double s = g.sd();
        double hm = 1e-5 * m;
        double hs = 1e-5 * s;
        double[] up = fam.ofMeanSd(m + hm, s).parameters();
        double[] dn = fam.ofMeanSd(m - hm, s).parameters();
        double[] us = fam.ofMeanSd(m, s + hs).parameters();
        double[] ds = fam.ofMeanSd(m, s - hs).parameters();
        double[][] cov = new double[k][k];
        for (int i = 0; i < k; i++) {
            double ji0 = (up[i] - dn[i]) / (2 * hm);
            double ji1 = (us[i] - ds[i]) / (2 * hs);
            for (int j = 0; j < k; j++) {
                double jj0 = (up[j] - dn[j]) / (2 * hm);
                double jj1 = (us[j] - ds[j]) / (2 * hs);
                cov[i][j] = ji0 * jj0 * seMean * seMean + ji1 * jj1 * seSd * seSd;
            }
        }
        return cov;
    }
}
