package org.roseate.sweep;

import org.roseate.noise.FrameSource;

/**
 * Plays a sweep once on every channel, preceded and followed by silence, then silence for ever.
 * Single-threaded, allocation-free in {@link #render}.
 */
public final class SweepSource implements FrameSource {
    private final SweepSpec spec;
    private final double peak;
    private final int channels;
    private final long leadFrames;
    private final long sweepFrames;
    private long position;

    /**
     * @param spec        the sweep
     * @param peak        peak amplitude, 0 &lt; peak ≤ 1 (full scale); the RMS level is peak/√2
     * @param channels    1 or more, all carrying the same sweep
     * @param leadSeconds silence before the sweep, ≥ 0
     */
    public SweepSource(SweepSpec spec, double peak, int channels, double leadSeconds) {
        if (!(peak > 0 && peak <= 1)) {
            throw new IllegalArgumentException("peak=" + peak + " must be in (0, 1]");
        }
        if (channels < 1) {
            throw new IllegalArgumentException("channels=" + channels + " must be >= 1");
        }
        if (!(leadSeconds >= 0)) {
            throw new IllegalArgumentException("leadSeconds=" + leadSeconds + " must be >= 0");
        }
        this.spec = spec;
        this.peak = peak;
        this.channels = channels;
        this.leadFrames = Math.round(leadSeconds * spec.sampleRateHz());
        this.sweepFrames = spec.lengthFrames();
    }

    @Override
    public int channels() {
        return channels;
    }

    @Override
    public double sampleRateHz() {
        return spec.sampleRateHz();
    }

    /** Frames until the sweep has ended (lead silence plus the sweep). */
    public long framesUntilEnd() {
        return leadFrames + sweepFrames;
    }

    @Override
    public void render(double[] interleaved, int frames) {
        for (int f = 0; f < frames; f++) {
            long k = position + f - leadFrames;
            double v = k >= 0 && k < sweepFrames ? peak * spec.sample(k) : 0.0;
            int base = f * channels;
            for (int c = 0; c < channels; c++) {
                interleaved[base + c] = v;
            }
        }
        position += frames;
    }
}
