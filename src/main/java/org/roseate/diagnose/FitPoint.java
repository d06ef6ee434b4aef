package org.roseate.diagnose;

/**
 * One analysis point after the fit, all levels in dB.
 *
 * @param hz            frequency, Hz
 * @param measuredDb    the measurement
 * @param fittedDb      the model with the estimated values (plus the fitted level offset when the
 *                      level is free)
 * @param designDb      the model with the nominal values (plus its own best level offset when the
 *                      level is free, so the two curves compare in shape)
 * @param uncertaintyDb standard uncertainty of measuredDb
 * @param trusted       whether the point entered the fit
 */
public record FitPoint(double hz, double measuredDb, double fittedDb, double designDb, double uncertaintyDb,
        boolean trusted) {
    /** measuredDb − fittedDb. */
    public double residualDb() {
        return measuredDb - fittedDb;
    }
}
