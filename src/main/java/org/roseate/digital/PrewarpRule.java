package org.roseate.digital;

import org.roseate.model.Complex;

/**
 * How analog roots are adjusted before the bilinear map s = 2fs·(z − 1)/(z + 1).
 *
 * <p>The bilinear map sends the analog frequency Ω (rad/s) to the digital frequency ω (rad/s)
 * with Ω = 2fs·tan(ω/(2fs)): the whole jΩ axis is squeezed into 0..fs/2, so a corner at ω
 * lands lower than intended unless it is first moved up to 2fs·tan(ω/(2fs)). Source: the
 * bilinear-transform frequency warping and its prewarping correction, Oppenheim &amp; Schafer,
 * Discrete-Time Signal Processing, section on the bilinear transformation (common practice).
 */
public enum PrewarpRule {
    /** Plain bilinear map, no prewarping (scipy.signal.bilinear_zpk). Corners land low, more so near Nyquist. */
    NONE,
    /**
     * The default. Every root p ≠ 0 is scaled along its own ray before the bilinear map:
     * p' = p · 2fs·tan(|p|/(2fs)) / |p|.
     *
     * <p>Consequence: the magnitude |p| of every pole and zero (its corner frequency |p|/2π Hz) lands
     * exactly at the same frequency in the digital filter, and since the angle of the root is kept, the
     * Q of a complex pair (|p| / (2·|Re p|)) is kept too. Between and above the corners the response is
     * still warped, which is why the band fidelity improves with oversampling.
     *
     * <p>Corners at or above 0.45·fs ({@link #PREWARP_LIMIT_FRACTION_OF_RATE}) cannot land exactly
     * (at and above Nyquist there is no image at all): such roots, typically an op-amp's closed-loop
     * pole near 1 MHz whose in-band effect is a few thousandths of a dB, are scaled by the factor
     * the limit itself gets, tan(0.45π)/(0.45π) ≈ 4.47, so the rule is continuous in |p| and keeps
     * the order of the roots. With the chain's oversampling every audio corner lies far below the limit.
     */
    PER_ROOT;

    /** Corners at or above this fraction of the sample rate get the limit's prewarp factor: 0.45. */
    public static final double PREWARP_LIMIT_FRACTION_OF_RATE = 0.45;

    /**
     * The root as this rule moves it before the bilinear map.
     *
     * @param root         analog pole or zero in rad/s, finite
     * @param sampleRateHz sample rate fs in Hz, finite and &gt; 0
     * @return the root itself for NONE and for root = 0; otherwise p·2fs·tan(x)/|p| with
     *         x = min(|p|, 2π·0.45·fs)/(2fs)
     */
    public Complex prewarp(Complex root, double sampleRateHz) {
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
        if (this == NONE) {
            return root;
        }
        double w = root.abs();
        if (w == 0) {
            return root;
        }
        double fs2 = 2 * sampleRateHz;
        double x = Math.min(w, 2 * Math.PI * PREWARP_LIMIT_FRACTION_OF_RATE * sampleRateHz) / fs2;
        return root.times(Math.tan(x) / x);
    }
}
