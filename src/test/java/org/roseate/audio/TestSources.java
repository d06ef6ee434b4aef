package org.roseate.audio;

import java.util.SplittableRandom;
import org.roseate.noise.FrameSource;

/** Small seeded sources for the engine tests. */
final class TestSources {
    private TestSources() {
    }

    /** A sine of the given peak amplitude on every channel. */
    static FrameSource sine(int rateHz, int channels, double hz, double amplitude) {
        return new FrameSource() {
            long n;

            @Override
            public int channels() {
                return channels;
            }

            @Override
            public double sampleRateHz() {
                return rateHz;
            }

            @Override
            public void render(double[] x, int frames) {
                for (int f = 0; f < frames; f++, n++) {
                    double v = amplitude * Math.sin(2 * Math.PI * hz * n / rateHz);
                    for (int c = 0; c < channels; c++) {
                        x[f * channels + c] = v;
                    }
                }
            }
        };
    }

    /**
     * Gaussian noise through a one-pole low-pass y[n] = a·y[n−1] + (1 − a)·x[n], scaled to an RMS of
     * {@code rms}, plus a constant offset: a signal whose sample-to-sample steps are much smaller than
     * its value, so a hard cut between two of them shows as a jump.
     */
    static FrameSource lowpassNoise(int rateHz, int channels, long seed, double a, double rms, double offset) {
        // RMS of the AR(1) output for unit white input: (1 − a)/sqrt(1 − a²) (closed form of the
        // AR(1) variance, σ² (1 − a)² / (1 − a²)).
        double scale = rms * Math.sqrt(1 - a * a) / (1 - a);
        SplittableRandom r = new SplittableRandom(seed);
        return new FrameSource() {
            double y;

            @Override
            public int channels() {
                return channels;
            }

            @Override
            public double sampleRateHz() {
                return rateHz;
            }

            @Override
            public void render(double[] x, int frames) {
                for (int f = 0; f < frames; f++) {
                    y = a * y + (1 - a) * r.nextGaussian();
                    for (int c = 0; c < channels; c++) {
                        x[f * channels + c] = offset + scale * y;
                    }
                }
            }
        };
    }
}
