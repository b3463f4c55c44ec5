package org.incipit.distributions;

import java.util.List;
import java.util.Locale;

/** The built-in families: gamma, Weibull and lognormal. */
public final class DelayFamilies {

    /** Gamma, parameters ["shape", "rate"], both positive. */
    public static final DelayFamily GAMMA = new Family("gamma", List.of("shape", "rate"),
            List.of(DelayFamily.Domain.POSITIVE, DelayFamily.Domain.POSITIVE)) {
        @Override
        public ParametricDelay of(double... p) {
            Checks.length(p, 2, "shape, rate");
            return GammaDelay.ofShapeRate(p[0], p[1]);
        }

        @Override
        public ParametricDelay ofMeanSd(double mean, double sd) {
            return GammaDelay.ofMeanSd(mean, sd);
        }
    };

    /** Weibull, parameters ["shape", "scale"], both positive. */
    public static final DelayFamily WEIBULL = new Family("weibull", List.of("shape", "scale"),
            List.of(DelayFamily.Domain.POSITIVE, DelayFamily.Domain.POSITIVE)) {
        @Override
        public ParametricDelay of(double... p) {
            Checks.length(p, 2, "shape, scale");
            return WeibullDelay.ofShapeScale(p[0], p[1]);
        }

        @Override
        public ParametricDelay ofMeanSd(double mean, double sd) {
            return WeibullDelay.ofMeanSd(mean, sd);
        }
    };

    /** Lognormal, parameters ["meanLog", "sdLog"]: real and positive. */
    public static final DelayFamily LOGNORMAL = new Family("lognormal", List.of("meanLog", "sdLog"),
            List.of(DelayFamily.Domain.REAL, DelayFamily.Domain.POSITIVE)) {
        @Override
        public ParametricDelay of(double... p) {
            Checks.length(p, 2, "meanLog, sdLog");
            return LogNormalDelay.ofMeanLogSdLog(p[0], p[1]);
        }

        @Override
        public ParametricDelay ofMeanSd(double mean, double sd) {
            return LogNormalDelay.ofMeanSd(mean, sd);
        }
    };

    private static final List<DelayFamily> ALL = List.of(GAMMA, WEIBULL, LOGNORMAL);

    private DelayFamilies() {
    }

    /** @return gamma, Weibull, lognormal (unmodifiable). */
    public static List<DelayFamily> all() {
        return ALL;
    }

    /**
     * @param name "gamma", "weibull" or "lognormal" (case-insensitive)
     * @return the family
     * @throws IllegalArgumentException for any other name, listing the valid ones
     */
    public static DelayFamily byName(String name) {
        if (name != null) {
            String n = name.trim().toLowerCase(Locale.ROOT);
            for (DelayFamily f : ALL) {
                if (f.name().equals(n)) {
                    return f;
                }
            }
        }
        throw new IllegalArgumentException("family must be one of gamma, weibull, lognormal, was " + name);
    }

    private abstract static class Family implements DelayFamily {
        private final String name;
        private final List<String> names;
        private final List<Domain> domains;

        Family(String name, List<String> names, List<Domain> domains) {
            this.name = name;
            this.names = names;
            this.domains = domains;
        }

        @Override
        public String name() {
            return name;
        }

        @Override
        public List<String> parameterNames() {
            return names;
        }

        @Override
        public List<Domain> parameterDomains() {
            return domains;
        }

        @Override
        public String toString() {
            return name;
        }
    }
}
