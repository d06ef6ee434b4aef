package org.roseate.sweep;

/**
 * Standard uncertainties (one standard deviation) of a swept-sine point, for a consumer that weights
 * points by their scatter (a fit), derived from the point's bounds. A bound is the noise part,
 * {@link SweepAnalyzer#NOISE_RMS_FACTOR} times the noise's RMS, plus the method's allowance. The
 * noise part over that factor is taken as the noise's standard deviation; the allowance, a bound
 * with no known distribution inside it, counts as rectangular, a/√3 (GUM, JCGM 100:2008, 4.3.7); the
 * two add in quadrature.
 */
public final class SweepUncertainty {
    private SweepUncertainty() {
    }

    /** σ of {@link SweepPoint#magnitudeDb}, dB; NaN where the point has no magnitude. */
    public static double magnitudeDb(SweepSpec spec, SweepPoint p) {
        boolean low = p.hz() < SweepAnalyzer.LOW_EDGE_FACTOR * spec.startHz();
        return combine(p.magnitudeBoundDb(), low ? SweepAnalyzer.MAGNITUDE_METHOD_DB_LOW : SweepAnalyzer.MAGNITUDE_METHOD_DB);
    }

    /** σ of {@link SweepPoint#phaseDeg}, degrees; NaN where the point has no phase. */
    public static double phaseDeg(SweepSpec spec, SweepPoint p) {
        boolean low = p.hz() < SweepAnalyzer.LOW_EDGE_FACTOR * spec.startHz();
        return combine(p.phaseBoundDeg(), low ? SweepAnalyzer.PHASE_METHOD_DEG_LOW : SweepAnalyzer.PHASE_METHOD_DEG);
    }

    private static double combine(double bound, double allowance) {
        if (!Double.isFinite(bound)) {
            return Double.NaN;
        }
        double noise = Math.max(0, bound - allowance) / SweepAnalyzer.NOISE_RMS_FACTOR;
        return Math.sqrt(noise * noise + allowance * allowance / 3);
    }
}
