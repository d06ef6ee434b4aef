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
 * @param noise        input-referred noise and output limits ({@link Noise#NONE} when the file gives
 *                     none: a noiseless op-amp with unknown swing and slew rate)
 */
public record OpAmp(double gbwHz, double openLoopGain, Noise noise) {
    public static final double DEFAULT_OPEN_LOOP_GAIN = 1e5;

    /** The ideal op-amp: infinite gain at every frequency. */
    public static final OpAmp IDEAL = new OpAmp(Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY);

    /** A gain model without noise data or limits. */
    public OpAmp(double gbwHz, double openLoopGain) {
        this(gbwHz, openLoopGain, Noise.NONE);
    }

    public OpAmp {
        java.util.Objects.requireNonNull(noise, "noise");
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

    /** The same gain model with other noise data and limits. */
    public OpAmp withNoise(Noise newNoise) {
        return new OpAmp(gbwHz, openLoopGain, newNoise);
    }

    /**
     * An op-amp's input-referred noise and output limits, as on a data sheet. The voltage noise is a
     * source in series with the + input, density en²·(1 + enCornerHz/f) in V²/Hz; the current noise
     * is an independent current from gnd into each input, in²·(1 + inCornerHz/f) in A²/Hz (the two
     * inputs' current noises taken as uncorrelated, common practice for data-sheet figures). A value
     * of 0 means "not given": no noise of that kind; NaN swing or slew means "not given".
     *
     * @param enVPerRtHz white input voltage noise density, V/√Hz, ≥ 0 (e.g. 18e-9 for a TL07x class part, from memory)
     * @param inAPerRtHz white input current noise density, A/√Hz, ≥ 0
     * @param enCornerHz 1/f corner of the voltage noise, Hz, ≥ 0 (0: white)
     * @param inCornerHz 1/f corner of the current noise, Hz, ≥ 0 (0: white)
     * @param swingV     peak output swing (symmetric about 0 V), V, &gt; 0, or NaN when not given
     * @param slewVPerUs slew rate, V/µs, &gt; 0, or NaN when not given
     */
    public record Noise(double enVPerRtHz, double inAPerRtHz, double enCornerHz, double inCornerHz, double swingV,
            double slewVPerUs) {
        /** No noise data and no limits. */
        public static final Noise NONE = new Noise(0, 0, 0, 0, Double.NaN, Double.NaN);

        public Noise {
            for (double v : new double[] {enVPerRtHz, inAPerRtHz, enCornerHz, inCornerHz}) {
                if (!(v >= 0) || !Double.isFinite(v)) {
                    throw new IllegalArgumentException("noise densities and corners must be finite and >= 0");
                }
            }
            if (!Double.isNaN(swingV) && !(swingV > 0 && Double.isFinite(swingV))) {
                throw new IllegalArgumentException("swingV=" + swingV + " must be finite and > 0");
            }
            if (!Double.isNaN(slewVPerUs) && !(slewVPerUs > 0 && Double.isFinite(slewVPerUs))) {
                throw new IllegalArgumentException("slewVPerUs=" + slewVPerUs + " must be finite and > 0");
            }
        }

        /** en²·(1 + enCornerHz/f), V²/Hz. */
        public double voltageDensitySquared(double hz) {
            return enVPerRtHz * enVPerRtHz * (1 + enCornerHz / hz);
        }

        /** in²·(1 + inCornerHz/f), A²/Hz, at each input. */
        public double currentDensitySquared(double hz) {
            return inAPerRtHz * inAPerRtHz * (1 + inCornerHz / hz);
        }

        public boolean hasSwing() {
            return !Double.isNaN(swingV);
        }

        public boolean hasSlew() {
            return !Double.isNaN(slewVPerUs);
        }

        /** True when nothing is given. */
        public boolean isNone() {
            return equals(NONE);
        }
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
