package org.roseate.diagnose;

/**
 * One part's estimated value. Values are in Ω, F or H.
 *
 * @param designator         reference designator
 * @param nominal            the design's value
 * @param tolerance          tolerance fraction used for the prior
 * @param estimate           maximum a posteriori value
 * @param low                lower end of the central credible interval at the diagnosis's
 *                           confidence, from the posterior normal on ln(value)
 * @param high               upper end of that interval
 * @param probabilityOutside posterior probability that the value lies outside
 *                           nominal·(1 ± tolerance), 0 … 1
 * @param outOfTolerance     probabilityOutside at or above the diagnosis's confidence
 */
public record PartEstimate(String designator, double nominal, double tolerance, double estimate, double low,
        double high, double probabilityOutside, boolean outOfTolerance) {
    /** Estimate relative to nominal, in percent (+10 for 10 % high). */
    public double changePercent() {
        return (estimate / nominal - 1) * 100;
    }
}
