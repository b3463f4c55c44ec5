package org.incipit.report;

import org.incipit.core.inference.Estimate;

/**
 * One row of a naive-versus-corrected figure: the same quantity estimated two ways.
 *
 * @param label     what is estimated, e.g. "mean serial interval"
 * @param naive     the naive estimate
 * @param corrected the corrected estimate
 */
public record Comparison(String label, Estimate naive, Estimate corrected) {

    /**
     * Validates.
     *
     * @param label     what is estimated, e.g. "mean serial interval"
     * @param naive     the naive estimate
     * @param corrected the corrected estimate
     * @throws IllegalArgumentException if a component is invalid
     */
    public Comparison {
        if (label == null || label.isBlank()) {
            throw new IllegalArgumentException("comparison label must not be blank");
        }
        if (naive == null || corrected == null) {
            throw new IllegalArgumentException("comparison '" + label + "' needs both estimates");
        }
    }
}
