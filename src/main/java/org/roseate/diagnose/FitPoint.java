package org.roseate.diagnose;

/**
 * One analysis point after the fit, levels in dB and phases in degrees.
 *
 * @param hz             frequency, Hz
 * @param measuredDb     the measurement
 * @param fittedDb       the model with the estimated values (plus the fitted level offset when the
 *                       level is free)
 * @param designDb       the model with the nominal values (plus its own best level offset when the
 *                       level is free, so the two curves compare in shape)
 * @param uncertaintyDb  standard uncertainty of measuredDb
 * @param trusted        whether the point entered the fit
 * @param measuredDeg    measured arg H, degrees, or NaN without a phase
 * @param fittedDeg      the fitted model's arg H, degrees (NaN without a measured phase)
 * @param designDeg      the design's arg H, degrees (NaN without a measured phase)
 * @param uncertaintyDeg standard uncertainty of measuredDeg, degrees, or NaN
 */
public record FitPoint(double hz, double measuredDb, double fittedDb, double designDb, double uncertaintyDb,
        boolean trusted, double measuredDeg, double fittedDeg, double designDeg, double uncertaintyDeg) {
    /** measuredDb − fittedDb. */
    public double residualDb() {
        return measuredDb - fittedDb;
    }

    /** measuredDeg − fittedDeg wrapped to (−180, 180], degrees; NaN without a phase. */
    public double residualDeg() {
        return LogMagnitudeModel.wrapDeg(measuredDeg - fittedDeg);
    }
}
