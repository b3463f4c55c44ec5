package org.incipit.core.study;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeMap;

/**
 * Names of data generators and estimators that scenario files may use, each with the factory
 * that makes it from the {@link Scenario} (and, for estimators, the level). Immutable; build one
 * with {@link #builder()}, or extend {@link #standard()} with {@link #toBuilder()}.
 *
 * <p>Each entry states its data set type; {@link #study(ScenarioSpec)} refuses to pair a
 * generator with an estimator of another data type.
 *
 * <pre>{@code
 * StudyRegistry registry = StudyRegistry.standard().toBuilder()
 *     .generator("my-outbreak", AmbiguousStartCases.class, scenario -> (rng, s, n) -> ...)
 *     .estimator("my-fit", AmbiguousStartCases.class, (scenario, level) ->
 *          StudyEstimator.of("my-fit", List.of("mean", "sd"), (rng, data) -> Map.of(...)))
 *     .build();
 * Study<?> study = registry.study(ScenarioSpec.read(Path.of("my.scenario")));
 * StudyResult result = study.run(ForkJoinPool.commonPool(), StudyListener.NONE);
 * }</pre>
 */
public final class StudyRegistry {

    /**
     * Makes a data generator for a scenario.
     *
     * @param <D> data set type
     */
    @FunctionalInterface
    public interface GeneratorFactory<D> {
        /**
         * @param scenario the scenario (check here that it has the true values and settings needed)
         * @return the generator
         * @throws IllegalArgumentException if the scenario lacks something the generator needs
         */
        DataGenerator<D> create(Scenario scenario);
    }

    /**
     * Makes an estimator for a scenario and level.
     *
     * @param <D> data set type
     */
    @FunctionalInterface
    public interface EstimatorFactory<D> {
        /**
         * @param scenario the scenario
         * @param level    nominal interval level in (0, 1)
         * @return the estimator; its name must be the registry name
         * @throws IllegalArgumentException if the scenario lacks something the estimator needs
         */
        StudyEstimator<D> create(Scenario scenario, double level);
    }

    private record Entry<F>(Class<?> dataType, F factory) {
    }

    private final Map<String, Entry<GeneratorFactory<?>>> generators;
    private final Map<String, Entry<EstimatorFactory<?>>> estimators;

    private StudyRegistry(Map<String, Entry<GeneratorFactory<?>>> g, Map<String, Entry<EstimatorFactory<?>>> e) {
        generators = Collections.unmodifiableMap(new TreeMap<>(g));
        estimators = Collections.unmodifiableMap(new TreeMap<>(e));
    }

    /** @return an empty builder */
    public static Builder builder() {
        return new Builder(new TreeMap<>(), new TreeMap<>());
    }

    /**
     * The registry used by the {@code study} command. It holds the calibration models:
     * generator {@code sample} (n independent values, option {@code family} = {@code normal}
     * with truths {@code mean} and {@code sd}, or {@code exponential} with truth {@code rate}),
     * and estimators {@code normal-mean-t} (target mean, Student t interval),
     * {@code normal-mean-z} (target mean, z interval with the true sd known),
     * {@code normal-variance-mle} (target variance, maximum-likelihood estimate with the exact
     * chi-square interval) and {@code exponential-rate-mle} (target rate, exact chi-square
     * interval). Their coverage is exact, so they check the harness itself.
     *
     * <p>It also holds the outbreak models (docs/scenarios.md lists names, settings and
     * targets): generators {@code ambiguous-starts} and {@code growth-counts}; estimators
     * {@code ambiguous-ml-gamma}, {@code ambiguous-ml-weibull}, {@code ambiguous-ml-lognormal},
     * {@code ambiguous-moments}, {@code ambiguous-em}, {@code naive-latest},
     * {@code naive-earliest}, {@code naive-midpoint}, {@code naive-single-only},
     * {@code growth-poisson}, {@code growth-nb}, {@code euler-lotka-known-gi} and
     * {@code euler-lotka-estimated-gi}; and the delay models: generators
     * {@code truncated-delays}, {@code censored-delays}, {@code backward-intervals},
     * {@code incubation-windows}, {@code fatality-counts}; estimators {@code delay-truncated},
     * {@code delay-censored}, {@code delay-observed-only}, {@code interval-growth-weighted},
     * {@code interval-backward-naive}, {@code backward-R-corrected}, {@code backward-R-naive},
     * {@code incubation-interval-censored}, {@code incubation-uniform},
     * {@code incubation-growing}, {@code fatality-crude}, {@code fatality-window-adjusted}.
     *
     * @return the standard registry
     */
    public static StudyRegistry standard() {
        Builder b = builder();
        CalibrationModels.register(b);
        OutbreakModels.register(b);
        DelayModels.register(b);
        return b.build();
    }

    /** @return a builder holding this registry's entries */
    public Builder toBuilder() {
        return new Builder(new TreeMap<>(generators), new TreeMap<>(estimators));
    }

    /** @return generator names, sorted */
    public Set<String> generatorNames() {
        return generators.keySet();
    }

    /** @return estimator names, sorted */
    public Set<String> estimatorNames() {
        return estimators.keySet();
    }

    /**
     * Builds the study a scenario file describes.
     *
     * @param spec the scenario file's content
     * @return the study
     * @throws IllegalArgumentException if a name is not registered, data types do not match, or
     *                                  a factory rejects the scenario
     */
    public Study<?> study(ScenarioSpec spec) {
        Entry<GeneratorFactory<?>> g = generators.get(spec.generator());
        if (g == null) {
            throw new IllegalArgumentException("unknown generator '" + spec.generator() + "'; known: "
                    + generators.keySet());
        }
        return build(g.dataType(), g.factory(), spec);
    }

    @SuppressWarnings("unchecked") // data types are checked against the generator's before the casts
    private <D> Study<D> build(Class<?> type, GeneratorFactory<?> gf, ScenarioSpec spec) {
        Scenario s = spec.scenario();
        DataGenerator<D> gen = ((GeneratorFactory<D>) gf).create(s);
        Study.Builder<D> b = Study.builder(s, gen);
        for (String name : spec.estimators()) {
            Entry<EstimatorFactory<?>> e = estimators.get(name);
            if (e == null) {
                throw new IllegalArgumentException("unknown estimator '" + name + "'; known: " + estimators.keySet());
            }
            if (!e.dataType().isAssignableFrom(type)) {
                throw new IllegalArgumentException("estimator '" + name + "' takes " + e.dataType().getSimpleName()
                        + " but generator '" + spec.generator() + "' makes " + type.getSimpleName());
            }
            StudyEstimator<D> est = ((EstimatorFactory<D>) e.factory()).create(s, spec.level());
            if (!est.name().equals(name)) {
                throw new IllegalStateException("factory of '" + name + "' made an estimator named '" + est.name() + "'");
            }
            b.estimator(est);
        }
        return b.sampleSizes(spec.sampleSizes()).replicates(spec.replicates()).seed(spec.seed())
                .level(spec.level()).build();
    }

    /** Builder of a {@link StudyRegistry}. */
    public static final class Builder {
        private final Map<String, Entry<GeneratorFactory<?>>> generators;
        private final Map<String, Entry<EstimatorFactory<?>>> estimators;

        private Builder(Map<String, Entry<GeneratorFactory<?>>> g, Map<String, Entry<EstimatorFactory<?>>> e) {
            generators = g;
            estimators = e;
        }

        /**
         * @param <D>      data set type
         * @param name     registry name (letters, digits, '.', '_' or '-'), not yet used
         * @param dataType the data set class it makes
         * @param factory  the factory
         * @return this builder
         * @throws IllegalArgumentException if the name is invalid or taken
         */
        public <D> Builder generator(String name, Class<D> dataType, GeneratorFactory<D> factory) {
            Scenario.requireName("generator name", name);
            if (generators.containsKey(name)) {
                throw new IllegalArgumentException("generator '" + name + "' is already registered");
            }
            generators.put(name, new Entry<>(Objects.requireNonNull(dataType), Objects.requireNonNull(factory)));
            return this;
        }

        /**
         * @param <D>      data set type
         * @param name     registry name, not yet used; the estimator made must carry it
         * @param dataType the data set class it takes
         * @param factory  the factory
         * @return this builder
         * @throws IllegalArgumentException if the name is invalid or taken
         */
        public <D> Builder estimator(String name, Class<D> dataType, EstimatorFactory<D> factory) {
            Scenario.requireName("estimator name", name);
            if (estimators.containsKey(name)) {
                throw new IllegalArgumentException("estimator '" + name + "' is already registered");
            }
            estimators.put(name, new Entry<>(Objects.requireNonNull(dataType), Objects.requireNonNull(factory)));
            return this;
        }

        /** @return the registry */
        public StudyRegistry build() {
            return new StudyRegistry(generators, estimators);
        }
    }

    @Override
    public String toString() {
        return "StudyRegistry[generators=" + new ArrayList<>(generators.keySet()) + ", estimators="
                + List.copyOf(estimators.keySet()) + "]";
    }
}
