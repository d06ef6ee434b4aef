package org.roseate.circuit;

/**
 * The op-amp model, one record for every stage kind. Today it holds the gain model; further model
 * keys (noise densities, output swing, slew rate) are added here and in {@link DesignReader}
 * without touching the nodal solver, which sees only {@link #inverseGain}.
 *
 * <p>Gain: the single-pole op-amp A(s) = A0 / (1 + s·A0/(2π·GBW)), so
 * 1/A(s) = 1/A0 + s/(2π·GBW). The ideal op-amp ({@link #IDEAL}) has GBW = A0 = +∞ and 1/A = 0: a
 * nullor in nodal analysis.
 *
 * @param gbwHz        gain-bandwidth product in Hz, &gt; 0 (e.g. 1e6 for a TL07x-class part), or
 *                     +∞ for the ideal op-amp
 * @param openLoopGain A0, the DC open-loop gain (ratio, not dB), &gt; 0; 1e5 when not given with a
 *                     finite GBW; +∞ exactly when GBW is +∞
 */
public record OpAmp(double gbwHz, double openLoopGain) {
    public static final double DEFAULT_OPEN_LOOP_GAIN = 1e5;

    /** The ideal op-amp: infinite gain at every frequency. */
    public static final OpAmp IDEAL = new OpAmp(Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY);

    public OpAmp {
        if (!(gbwHz > 0) || Double.isNaN(gbwHz)) {
            throw new IllegalArgumentException("gbwHz=" + gbwHz + " must be > 0");
        }
        if (!(openLoopGain > 0) || Double.isNaN(openLoopGain)) {
            throw new IllegalArgumentException("openLoopGain=" + openLoopGain + " must be > 0");
        }
        if (Double.isInfinite(gbwHz) != Double.isInfinite(openLoopGain)) {
            throw new IllegalArgumentException("gbwHz=" + gbwHz + " and openLoopGain=" + openLoopGain
                    + " must be both finite or both infinite (ideal)");
        }
    }

    /** A single-pole op-amp with the default open-loop gain. */
    public static OpAmp singlePole(double gbwHz) {
        return new OpAmp(gbwHz, DEFAULT_OPEN_LOOP_GAIN);
    }

    /** True for the ideal op-amp (a nullor). */
    public boolean isIdeal() {
        return Double.isInfinite(gbwHz);
    }

    /** The open-loop pole's time constant A0/(2π·GBW), in seconds (0 for the ideal op-amp). */
    public double poleTimeConstantSeconds() {
        return isIdeal() ? 0 : openLoopGain / (2 * Math.PI * gbwHz);
    }

    /**
     * The gain model as the solver uses it: 1/A(s) = {@code c0} + s·{@code c1}, with
     * c0 = 1/A0 and c1 = 1/(2π·GBW) in seconds; both 0 for the ideal op-amp.
     */
    public InverseGain inverseGain() {
        return isIdeal() ? new InverseGain(0, 0) : new InverseGain(1 / openLoopGain, 1 / (2 * Math.PI * gbwHz));
    }

    /**
     * 1/A(s) = {@code dc} + s·{@code perRadPerS}: affine in s, which keeps the nodal determinant a
     * polynomial of degree one per op-amp.
     *
     * @param dc         1/A0, dimensionless, ≥ 0
     * @param perRadPerS 1/(2π·GBW), seconds, ≥ 0
     */
    public record InverseGain(double dc, double perRadPerS) {
        public boolean isZero() {
            return dc == 0 && perRadPerS == 0;
        }
    }
}
