package org.incipit.core.study;

import java.util.Collections;
import java.util.Map;
import java.util.TreeMap;

/**
 * What a simulation study assumes: the true values of the target quantities (e.g. "mean",
 * "sd", "p", "R") and the settings of the data generator. Immutable; the maps are copied and
 * sorted by name.
 *
 * @param name     scenario name: letters, digits, '.', '_' or '-', not empty
 * @param truths   true value of each target quantity by name, finite; copied
 * @param settings numeric generator settings by name, finite; copied
 * @param options  text generator options by name (e.g. "family" = "gamma"), not blank; copied
 */
public record Scenario(String name, Map<String, Double> truths, Map<String, Double> settings,
                       Map<String, String> options) {

    /**
     * Validates and copies.
     *
     * @param name     scenario name: letters, digits, '.', '_' or '-', not empty
     * @param truths   true values by name, finite
     * @param settings numeric settings by name, finite
     * @param options  text options by name, not blank
     * @throws IllegalArgumentException if a name or value is invalid
     */
    public Scenario {
        requireName("scenario name", name);
        truths = finiteCopy("truth", truths);
        settings = finiteCopy("setting", settings);
        if (options == null) {
            throw new IllegalArgumentException("options must not be null (use Map.of())");
        }
        TreeMap<String, String> o = new TreeMap<>();
        for (Map.Entry<String, String> e : options.entrySet()) {
            requireName("option name", e.getKey());
            if (e.getValue() == null || e.getValue().isBlank()) {
                throw new IllegalArgumentException("option '" + e.getKey() + "' must not be blank");
            }
            o.put(e.getKey(), e.getValue().strip());
        }
        options = Collections.unmodifiableMap(o);
    }

    /**
     * A scenario with true values only.
     *
     * @param name   scenario name
     * @param truths true values by name
     * @return the scenario
     */
    public static Scenario of(String name, Map<String, Double> truths) {
        return new Scenario(name, truths, Map.of(), Map.of());
    }

    /**
     * @param target target name
     * @return its true value
     * @throws IllegalArgumentException if the scenario has no true value for {@code target}
     */
    public double truth(String target) {
        Double v = truths.get(target);
        if (v == null) {
            throw new IllegalArgumentException("scenario '" + name + "' has no true value for '" + target
                    + "'; it has " + truths.keySet());
        }
        return v;
    }

    /** @param target target name @return true if the scenario has a true value for it */
    public boolean hasTruth(String target) {
        return truths.containsKey(target);
    }

    /**
     * @param key setting name
     * @return its value
     * @throws IllegalArgumentException if the setting is absent
     */
    public double setting(String key) {
        Double v = settings.get(key);
        if (v == null) {
            throw new IllegalArgumentException("scenario '" + name + "' has no setting '" + key + "'; it has "
                    + settings.keySet());
        }
        return v;
    }

    /**
     * @param key      setting name
     * @param fallback value if absent
     * @return the setting or {@code fallback}
     */
    public double setting(String key, double fallback) {
        return settings.getOrDefault(key, fallback);
    }

    /**
     * @param key      option name
     * @param fallback value if absent
     * @return the option or {@code fallback}
     */
    public String option(String key, String fallback) {
        return options.getOrDefault(key, fallback);
    }

    static void requireName(String what, String s) {
        if (s == null || !s.matches("[A-Za-z0-9._-]+")) {
            throw new IllegalArgumentException(what + " must be letters, digits, '.', '_' or '-', was '" + s + "'");
        }
    }

    private static Map<String, Double> finiteCopy(String what, Map<String, Double> m) {
        if (m == null) {
            throw new IllegalArgumentException(what + "s must not be null (use Map.of())");
        }
        TreeMap<String, Double> c = new TreeMap<>();
        for (Map.Entry<String, Double> e : m.entrySet()) {
            requireName(what + " name", e.getKey());
            Double v = e.getValue();
            if (v == null || !Double.isFinite(v)) {
                throw new IllegalArgumentException(what + " '" + e.getKey() + "' must be finite, was " + v);
            }
            c.put(e.getKey(), v);
        }
        return Collections.unmodifiableMap(c);
    }
}
