package org.roseate.spectrum;

/**
 * Streaming Welch power spectral density of one channel, on JTransforms.
 *
 * <p>Life cycle: {@link #prepare} builds the FFT plan, window and buffers once; {@link #accept}
 * takes any number of samples (carrying a partial segment to the next call, so blocks of 1, 3,
 * 64 or the whole signal give the same result) and allocates nothing; {@link #snapshot} returns an
 * immutable {@link SpectralDensity} (and allocates it); {@link #reset} forgets all data. A sample
 * tail shorter than a hop is carried and never analysed, as in scipy.signal.welch.
 *
 * <p>Threading: not thread-safe. Feed and snapshot from one analysis thread (a capture thread
 * fills a ring, the analysis thread drains it into {@link #accept}) and publish the immutable
 * snapshots, for example through an {@code AtomicReference}. JTransforms itself may split
 * transforms longer than 8192 points over its worker pool.
 */
public final class WelchEstimator {
    private final WelchCore core = new WelchCore(1);

    /**
     * Builds the plan and buffers and clears all data.
     *
     * @param sampleRateHz finite, &gt; 0
     * @throws IllegalArgumentException if the rate is not finite and positive
     */
    public void prepare(double sampleRateHz, WelchSettings settings) {
        core.prepare(sampleRateHz, settings);
    }

    /**
     * Adds samples[offset … offset + n) (full scale ±1). Any n ≥ 0; allocates nothing.
     *
     * @throws IllegalStateException    before prepare
     * @throws IllegalArgumentException if the range lies outside the array
     */
    public void accept(double[] samples, int offset, int n) {
        core.requirePrepared();
        if (offset < 0 || n < 0 || offset > samples.length - n) {
            throw new IllegalArgumentException("offset=" + offset + ", n=" + n + " outside an array of "
                    + samples.length);
        }
        core.accept(samples, offset, null, 0, 1, n);
    }

    /**
     * Adds one channel of interleaved frames: interleaved[f·channels + channel] for f = 0 … frames − 1.
     *
     * @param channel zero-based, within [0, channels)
     * @throws IllegalArgumentException if the channel or frame count does not fit the array
     */
    public void acceptInterleaved(double[] interleaved, int frames, int channels, int channel) {
        core.requirePrepared();
        if (channels < 1 || channel < 0 || channel >= channels || frames < 0
                || (long) frames * channels > interleaved.length) {
            throw new IllegalArgumentException("frames=" + frames + ", channels=" + channels + ", channel=" + channel
                    + " do not fit an array of " + interleaved.length);
        }
        if (frames > 0) {
            core.accept(interleaved, channel, null, 0, channels, frames);
        }
    }

    /**
     * Transforms segments of 4096 to 2^20 points on several threads when {@code on} (for long file
     * jobs; off by default, and off for live use). The results are bitwise the same either way: the
     * segments are still added to the averages one by one in order. Helper threads are daemon
     * threads that end when idle.
     */
    public void transformInParallel(boolean on) {
        core.parallel(on);
    }

    /** Segments averaged so far. */
    public long averages() {
        return core.segments();
    }

    /** Clears all data; the plan is kept. */
    public void reset() {
        core.reset();
    }

    /**
     * The current estimate, FS²/Hz.
     *
     * @throws IllegalStateException before prepare
     */
    public SpectralDensity snapshot() {
        core.requirePrepared();
        return new SpectralDensity(core.sampleRateHz(), core.settings(), core.frequencies(), core.gxx(),
                core.segments(), core.effectiveAverages(), core.effectiveDurationSeconds(),
                DensityUnit.FULL_SCALE_SQUARED_PER_HZ);
    }
}
