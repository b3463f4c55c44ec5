package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.incipit.core.estimate.ambiguous.AmbiguousStartFit;
import org.incipit.core.estimate.ambiguous.NaiveFit;
import org.incipit.core.estimate.delay.DelayEstimator;
import org.incipit.core.estimate.delay.DelayFit;
import org.incipit.core.inference.ModelComparison;
import java.util.ArrayList;
import java.util.function.Function;
import org.incipit.core.EstimationException;
import org.incipit.core.inference.Estimate;
import org.incipit.distributions.DelayFamilies;
import org.incipit.distributions.DelayFamily;
import org.incipit.distributions.ParametricDelay;
import org.incipit.io.FitSummary;
import org.incipit.io.JsonOutput;
import org.incipit.io.TextTable;

/** Fitted families in the output contract: parameter names in lower case, tables. */
final class Fits {

    private Fits() {
    }

    /** @return "meanlog" for "meanLog": the JSON contract spells parameter names in lower case */
    static String jsonName(String parameter) {
        return parameter.toLowerCase(Locale.ROOT);
    }

    /** The families named by a --family value: one, or all three for "all". */
    static List<DelayFamily> families(String option, String value) {
        if (value.trim().equalsIgnoreCase("all")) {
            return DelayFamilies.all();
        }
        try {
            return List.of(DelayFamilies.byName(value));
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(option + " must be gamma, weibull, lognormal or all, was '" + value + "'");
        }
    }

    static Map<String, Double> parameters(List<String> names, List<Estimate> values) {
        Map<String, Double> m = new LinkedHashMap<>();
        for (int i = 0; i < names.size(); i++) {
            m.put(jsonName(names.get(i)), values.get(i).estimate());
        }
        return m;
    }

    static FitSummary summary(AmbiguousStartFit f) {
        return new FitSummary(f.family(), parameters(f.parameterNames(), f.parameters()), f.mean(), f.sd(),
                f.logLikelihood(), f.aic(), f.cases(), f.converged());
    }

    static FitSummary summary(NaiveFit f) {
        return new FitSummary(f.family(), parameters(f.parameterNames(), f.parameters()), f.mean(), f.sd(),
                f.logLikelihood(), f.aic(), f.cases(), f.converged());
    }

    /** The distribution at the point estimates. */
    static ParametricDelay distribution(String family, List<Estimate> parameters) {
        double[] p = new double[parameters.size()];
        for (int i = 0; i < p.length; i++) {
            p[i] = parameters.get(i).estimate();
        }
        return DelayFamilies.byName(family).of(p);
    }

    /** Fit JSON plus the transmission probability (one category) or one per category. */
    static ObjectNode json(AmbiguousStartFit f) {
        ObjectNode o = JsonOutput.fit(summary(f));
        if (f.categories().size() == 1) {
            o.set("transmissionProbability", JsonOutput.estimate(f.transmission().get(0)));
        } else {
            ObjectNode t = o.putObject("transmissionProbability");
            for (int i = 0; i < f.categories().size(); i++) {
                t.set(f.categories().get(i), JsonOutput.estimate(f.transmission().get(i)));
            }
        }
        ObjectNode q = o.putObject("quantiles");
        for (int i = 0; i < f.quantileLevels().size(); i++) {
            q.set(TextTable.number(f.quantileLevels().get(i)), JsonOutput.estimate(f.quantiles().get(i)));
        }
        o.put("exposureHistory", f.history().label());
        o.put("candidates", f.candidates());
        if (!f.converged()) {
            o.put("message", f.message());
        }
        return o;
    }

    static String parameterCell(Map<String, Double> p) {
        StringBuilder sb = new StringBuilder();
        for (Map.Entry<String, Double> e : p.entrySet()) {
            if (sb.length() > 0) {
                sb.append(", ");
            }
            sb.append(e.getKey()).append(' ').append(TextTable.number(e.getValue()));
        }
        return sb.toString();
    }

    /** Table header and row of a fit. */
    static TextTable table() {
        return TextTable.of("family", "parameters", "mean (95% interval)", "sd (95% interval)", "AIC", "n",
                "converged");
    }

    static void row(TextTable t, FitSummary f) {
        t.row(f.family(), parameterCell(f.parameters()), Cli.cell(f.mean()), Cli.cell(f.sd()),
                TextTable.number(f.aic()), Integer.toString(f.n()), f.converged() ? "yes" : "no");
    }

    static FitSummary summary(DelayFit f) {
        return new FitSummary(f.family().name(), parameters(f.parameterNames(), f.parameters()), f.mean(), f.sd(),
                f.logLikelihood(), f.aic(), f.observations(), f.converged());
    }

    /** A delay fit that must have converged. */
    static DelayFit converged(DelayFit f) {
        if (!f.converged()) {
            throw new EstimationException(f.family().name() + " fit did not converge: " + f.message());
        }
        return f;
    }

    /** Fits of one or more families, with the best by AIC among the converged ones. */
    record DelayFits(List<DelayFit> fits, DelayFit best) {
    }

    static DelayFits fitAll(List<DelayFamily> families, Function<DelayFamily, DelayFit> fitter) {
        if (families.size() == 1) {
            DelayFit f = converged(fitter.apply(families.get(0)));
            return new DelayFits(List.of(f), f);
        }
        List<DelayFit> all = new ArrayList<>();
        List<DelayFit> ok = new ArrayList<>();
        for (DelayFamily fam : families) {
            DelayFit f = fitter.apply(fam);
            all.add(f);
            if (f.converged()) {
                ok.add(f);
            }
        }
        if (ok.isEmpty()) {
            throw new EstimationException("no family converged: " + all.get(0).message());
        }
        ModelComparison c = DelayEstimator.compare(ok);
        DelayFit best = ok.stream().filter(f -> f.family().name().equals(c.best().name())).findFirst().orElseThrow();
        return new DelayFits(all, best);
    }

    /** JSON of one fit, or {"fits":[..],"best":..}. */
    static ObjectNode json(DelayFits f) {
        if (f.fits().size() == 1) {
            return JsonOutput.fit(summary(f.best()));
        }
        List<FitSummary> s = new ArrayList<>();
        f.fits().forEach(x -> s.add(summary(x)));
        ObjectNode o = JsonOutput.fits(s, f.best().family().name());
        o.put("criterion", "AIC");
        return o;
    }

    static TextTable table(DelayFits f) {
        TextTable t = table();
        f.fits().forEach(x -> row(t, summary(x)));
        return t;
    }
}
