package org.roseate.measure;

/**
 * A derived figure and its one-standard-deviation uncertainty.
 *
 * @param value       the figure (NaN when it cannot be formed, e.g. fewer than two bands count)
 * @param uncertainty one standard deviation, same unit; NaN when unknown
 */
public record Estimate(double value, double uncertainty) {
    /** Neither value nor uncertainty. */
    public static final Estimate NONE = new Estimate(Double.NaN, Double.NaN);
}
