package org.roseate.sweep;

/**
 * One frequency of a swept-sine measurement. A figure the noise floor does not allow (noise above
 * half the signal) or that lies outside the sweep's full-level range is NaN, and so is its bound.
 *
 * @param hz                the (fundamental) frequency, Hz
 * @param magnitudeDb       20·log10|H|, H = response/reference
 * @param magnitudeBoundDb  |error| of magnitudeDb is below this, dB: the measured noise floor plus the
 *                          method's allowance (0.02 dB, 0.1 dB below 2.5·f₁)
 * @param phaseDeg          arg H in degrees, (−180, 180], reference and response windows aligned
 *                          on the reference's impulse
 * @param phaseBoundDeg     |error| of phaseDeg is below this, degrees (noise plus 0.15°, 0.7° below 2.5·f₁)
 * @param harmonic2Db       2nd harmonic response at 2·hz relative to the fundamental response at
 *                          hz, dB (for a sine of this frequency: the 2nd harmonic's level re the
 *                          fundamental at the output)
 * @param harmonic2BoundDb  bound of harmonic2Db: noise plus the method's 0.5 dB, dB
 * @param harmonic3Db       as harmonic2Db for the 3rd harmonic at 3·hz
 * @param harmonic3BoundDb  bound of harmonic3Db, dB
 */
public record SweepPoint(double hz, double magnitudeDb, double magnitudeBoundDb, double phaseDeg, double phaseBoundDeg,
        double harmonic2Db, double harmonic2BoundDb, double harmonic3Db, double harmonic3BoundDb) {
    /** The harmonic level of order 2 or 3, dB re the fundamental. */
    public double harmonicDb(int order) {
        return switch (order) {
            case 2 -> harmonic2Db;
            case 3 -> harmonic3Db;
            default -> throw new IllegalArgumentException("harmonic order " + order + ": expected 2 or 3");
        };
    }

    /** The bound of {@link #harmonicDb(int)}, dB. */
    public double harmonicBoundDb(int order) {
        return switch (order) {
            case 2 -> harmonic2BoundDb;
            case 3 -> harmonic3BoundDb;
            default -> throw new IllegalArgumentException("harmonic order " + order + ": expected 2 or 3");
        };
    }
}
