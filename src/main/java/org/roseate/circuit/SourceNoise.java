package org.roseate.circuit;

/**
 * The noise voltage that drives a design's first stage (a reverse-biased junction or a zener, say):
 * white above a 1/f corner, rising below it. Its one-sided density is
 * S(f) = d²·(1 + fc/f) in V²/Hz, the usual white-plus-flicker model of a noise source (common
 * practice; see e.g. any low-noise design text for the 1/f corner).
 *
 * @param densityVPerRtHz d, the white density in V/√Hz, finite and &gt; 0 (150e-6 for a typical
 *                        avalanche junction, from memory)
 * @param flickerCornerHz fc, the frequency where the 1/f part equals the white part, Hz, ≥ 0
 *                        (0: white)
 */
public record SourceNoise(double densityVPerRtHz, double flickerCornerHz) {
    public SourceNoise {
        if (!(densityVPerRtHz > 0) || !Double.isFinite(densityVPerRtHz)) {
            throw new IllegalArgumentException("densityVPerRtHz=" + densityVPerRtHz + " must be finite and > 0");
        }
        if (!(flickerCornerHz >= 0) || !Double.isFinite(flickerCornerHz)) {
            throw new IllegalArgumentException("flickerCornerHz=" + flickerCornerHz + " must be finite and >= 0");
        }
    }

    /** S(f) = d²·(1 + fc/f), V²/Hz, for f &gt; 0 in Hz. */
    public double densitySquared(double hz) {
        return densityVPerRtHz * densityVPerRtHz * (1 + flickerCornerHz / hz);
    }

    /** The shape 1 + fc/f alone (dimensionless), for judging source × circuit in relative dB. */
    public double shape(double hz) {
        return 1 + flickerCornerHz / hz;
    }
}
