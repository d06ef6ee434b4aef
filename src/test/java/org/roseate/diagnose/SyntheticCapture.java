package org.roseate.diagnose;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Random;
import org.roseate.circuit.Design;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;
import org.roseate.model.CircuitModel;

/**
 * Test-side captures of a built circuit, made without the project's spectrum or filter code:
 * seeded white noise x is filtered by the exact analog response H of the build, multiplied bin by
 * bin in one FFT over the whole record (a circular convolution, so the record is the steady state
 * of a periodic excitation and has no start-up transient), and written as 32-bit float WAV. The FFT
 * is a plain radix-2 Cooley–Tukey written here.
 */
public final class SyntheticCapture {
    private SyntheticCapture() {
    }

    /**
     * Writes a capture.
     *
     * @param built          the circuit as built (values already moved)
     * @param rateHz         sample rate, Hz
     * @param log2Frames     record length 2^log2Frames frames
     * @param transfer       true: two channels, reference x then response y; false: y alone
     * @param responseNoise  RMS of independent white noise added to y, relative to y's RMS
     * @param seed           seeds both noises
     */
    public static void write(Path file, Design built, int rateHz, int log2Frames, boolean transfer,
            double responseNoise, long seed) throws IOException {
        write(file, built, rateHz, log2Frames, transfer, responseNoise, seed, 1 << log2Frames);
    }

    /** As {@link #write(Path, Design, int, int, boolean, double, long)}, keeping only the first {@code keepFrames} frames. */
    public static void write(Path file, Design built, int rateHz, int log2Frames, boolean transfer,
            double responseNoise, long seed, int keepFrames) throws IOException {
        int n = 1 << log2Frames;
        if (keepFrames < 1 || keepFrames > n) {
            throw new IllegalArgumentException("keepFrames=" + keepFrames + " outside 1 … " + n);
        }
        Random rnd = new Random(seed);
        double[] xr = new double[n];
        for (int i = 0; i < n; i++) {
            xr[i] = 0.1 * rnd.nextGaussian();
        }
        double[] re = xr.clone();
        double[] im = new double[n];
        fft(re, im, false);
        int half = n / 2;
        double[] hz = new double[half];
        for (int k = 1; k <= half; k++) {
            hz[k - 1] = (double) k * rateHz / n;
        }
        double[] hr = new double[half];
        double[] hi = new double[half];
        CircuitModel.of(built, "built").response(hz, hr, hi);
        re[0] = 0;
        im[0] = 0;
        for (int k = 1; k <= half; k++) {
            double a = re[k] * hr[k - 1] - im[k] * hi[k - 1];
            double b = re[k] * hi[k - 1] + im[k] * hr[k - 1];
            re[k] = a;
            im[k] = b;
            if (k < half) {
                re[n - k] = a;
                im[n - k] = -b;
            } else {
                im[k] = 0;
            }
        }
        fft(re, im, true);
        double ms = 0;
        for (double v : re) {
            ms += v * v;
        }
        double noise = responseNoise * Math.sqrt(ms / n);
        // Keep the response's peaks below full scale whatever the design's gain.
        double scale = 0.05 / Math.sqrt(ms / n);
        int channels = transfer ? 2 : 1;
        double[] frames = new double[n * channels];
        for (int i = 0; i < n; i++) {
            double y = (re[i] + noise * rnd.nextGaussian()) * (transfer ? 1 : scale);
            if (transfer) {
                frames[2 * i] = xr[i];
                frames[2 * i + 1] = y;
            } else {
                frames[i] = y;
            }
        }
        try (OutputStream out = Files.newOutputStream(file)) {
            WavWriter w = WavWriter.withoutDither(out, new WavFormat(rateHz, channels, SampleEncoding.FLOAT_32), keepFrames);
            w.writeFrames(frames, keepFrames);
            w.finish();
        }
    }

    /** In-place radix-2 FFT (inverse scaled by 1/n); length a power of two. */
    static void fft(double[] re, double[] im, boolean inverse) {
        int n = re.length;
        for (int i = 1, j = 0; i < n; i++) {
            int bit = n >> 1;
            for (; (j & bit) != 0; bit >>= 1) {
                j ^= bit;
            }
            j ^= bit;
            if (i < j) {
                double t = re[i];
                re[i] = re[j];
                re[j] = t;
                t = im[i];
                im[i] = im[j];
                im[j] = t;
            }
        }
        for (int len = 2; len <= n; len <<= 1) {
            double ang = 2 * Math.PI / len * (inverse ? 1 : -1);
            for (int i = 0; i < n; i += len) {
                for (int k = 0; k < len / 2; k++) {
                    double wr = Math.cos(ang * k);
                    double wi = Math.sin(ang * k);
                    int a = i + k;
                    int b = a + len / 2;
                    double vr = re[b] * wr - im[b] * wi;
                    double vi = re[b] * wi + im[b] * wr;
                    re[b] = re[a] - vr;
                    im[b] = im[a] - vi;
                    re[a] += vr;
                    im[a] += vi;
                }
            }
        }
        if (inverse) {
            for (int i = 0; i < n; i++) {
                re[i] /= n;
                im[i] /= n;
            }
        }
    }
}
