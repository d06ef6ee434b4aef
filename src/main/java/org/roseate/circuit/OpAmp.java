package org.roseate.circuit;

/**
 * A single-pole op-amp: A(s) = A0 / (1 + s·A0/(2π·GBW)).
 *
 * @param gbwHz        gain-bandwidth product in Hz, finite and &gt; 0 (e.g. 1e6 for a TL07x-class part)
 * @param openLoopGain A0, the DC open-loop gain (ratio, not dB), finite and &gt; 0; 1e5 when not given
 */
public record OpAmp(double gbwHz, double openLoopGain) {
    public static final double DEFAULT_OPEN_LOOP_GAIN = 1e5;

    public OpAmp {
        if (!(gbwHz > 0) || !Double.isFinite(gbwHz)) {
            throw new IllegalArgumentException("gbwHz=" + gbwHz + " must be finite and > 0");
        }
        if (!(openLoopGain > 0) || !Double.isFinite(openLoopGain)) {
            throw new IllegalArgumentException("openLoopGain=" + openLoopGain + " must be finite and > 0");
        }
    }

    /** The open-loop pole's time constant A0/(2π·GBW), in seconds. */
    public double poleTimeConstantSeconds() {
        return openLoopGain / (2 * Math.PI * gbwHz);
    }
}
