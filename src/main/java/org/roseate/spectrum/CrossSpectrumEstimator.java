package org.roseate.spectrum;

/**
 * Streaming Welch auto and cross spectral densities of a reference x and a response y:
 * Gxx, Gyy and Gxy = conj(X)·Y (scipy.signal.csd's convention), one-sided, FS²/Hz. Same life cycle
 * and threading as {@link WelchEstimator}: prepare once, accept any n without allocating,
 * snapshot into an immutable {@link CrossSpectralDensity}.
 */
public final class CrossSpectrumEstimator {
    private final WelchCore core = new WelchCore(2);

    /**
     * Builds the plans and buffers and clears all data.
     *
     * @param sampleRateHz finite, &gt; 0
     */
    public void prepare(double sampleRateHz, WelchSettings settings) {
        core.prepare(sampleRateHz, settings);
    }

    /**
     * Adds x[offset … offset + n) and y[offset … offset + n), simultaneous samples.
     *
     * @throws IllegalArgumentException if the range lies outside either array
     */
    public void accept(double[] x, double[] y, int offset, int n) {
        core.requirePrepared();
        if (offset < 0 || n < 0 || offset > x.length - n || offset > y.length - n) {
            throw new IllegalArgumentException("offset=" + offset + ", n=" + n + " outside arrays of "
                    + x.length + " and " + y.length);
        }
        core.accept(x, offset, y, offset, 1, n);
    }

    /**
     * Adds two channels of interleaved frames.
     *
     * @param referenceChannel zero-based channel of x
     * @param responseChannel  zero-based channel of y
     */
    public void acceptInterleaved(double[] interleaved, int frames, int channels, int referenceChannel,
            int responseChannel) {
        core.requirePrepared();
        if (channels < 1 || referenceChannel < 0 || referenceChannel >= channels || responseChannel < 0
                || responseChannel >= channels || frames < 0 || (long) frames * channels > interleaved.length) {
            throw new IllegalArgumentException("frames=" + frames + ", channels=" + channels + ", reference="
                    + referenceChannel + ", response=" + responseChannel + " do not fit an array of "
                    + interleaved.length);
        }
        if (frames > 0) {
            core.accept(interleaved, referenceChannel, interleaved, responseChannel, channels, frames);
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

    /** Clears all data; the plans are kept. */
    public void reset() {
        core.reset();
    }

    /** The current estimate. */
    public CrossSpectralDensity snapshot() {
        core.requirePrepared();
        return new CrossSpectralDensity(core.sampleRateHz(), core.settings(), core.frequencies(), core.gxx(),
                core.gyy(), core.gxyRe(), core.gxyIm(), core.segments(), core.effectiveAverages(),
                core.effectiveDurationSeconds());
    }
}
