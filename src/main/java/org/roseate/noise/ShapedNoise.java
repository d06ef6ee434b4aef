package org.roseate.noise;

import java.util.function.DoubleUnaryOperator;
import org.jtransforms.fft.DoubleFFT_1D;

/**
 * Streaming Gaussian noise with a prescribed one-sided power density, for densities that are known
 * point by point but not as a rational function (a circuit's own noise at its output, say).
 *
 * <p><b>Method.</b> Seeded unit-variance white noise w[n] at fs is convolved with a linear-phase FIR
 * kernel h of L taps (L a power of two), by overlap-add with FFTs of 2L points, so memory is
 * constant whatever the duration. The kernel is the zero-phase inverse DFT of the amplitudes
 * A_k = √(P(k·fs/L)·fs/2), k = 0 … L/2 (mirrored), shifted by L/2 to be causal. The output density
 * is (2/fs)·|Σ h_n e^{−iωn}|², which equals P exactly at the grid frequencies k·fs/L and is
 * interpolated between them, so a density that changes little over fs/L is followed closely. The
 * output variance is Σh² = (fs/L)·Σ′P(k·fs/L) (Parseval), a Riemann sum of ∫₀^{fs/2} P df; the
 * constructor then rescales h so the variance equals {@code exactPowerV2} when the caller knows the
 * integral (by quadrature), so the total power is exact and only the shape is sampled.
 *
 * <p>The first block is run and discarded at construction, so the convolution's history is full and
 * the first output sample is already stationary. {@link #render} allocates nothing; not thread-safe.
 */
public final class ShapedNoise {
    private final int taps;
    private final DoubleFFT_1D fft;
    private final double[] kernelSpectrum;
    private final double[] work;
    private final double[] overlap;
    private final double[] ready;
    private int readyPos;
    private final WhiteNoiseSource white;
    private final double varianceV2;

    /**
     * @param densityV2PerHz P(f), one-sided, in V²/Hz, finite and ≥ 0 for 0 ≤ f ≤ fs/2
     * @param sampleRateHz   fs, Hz, &gt; 0
     * @param taps           L, a power of two from 16 to 2²⁰
     * @param exactPowerV2   ∫₀^{fs/2} P df if known (the kernel is scaled to it), or NaN to keep the
     *                       Riemann sum of the grid
     * @param white          the seeded white source (consumed by this instance)
     */
    public ShapedNoise(DoubleUnaryOperator densityV2PerHz, double sampleRateHz, int taps, double exactPowerV2,
            WhiteNoiseSource white) {
        if (taps < 16 || taps > (1 << 20) || Integer.bitCount(taps) != 1) {
            throw new IllegalArgumentException("taps=" + taps + " must be a power of two from 16 to 2^20");
        }
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
        this.taps = taps;
        this.white = white;
        double[] amp = new double[taps];
        for (int k = 0; k <= taps / 2; k++) {
            double p = densityV2PerHz.applyAsDouble(k * sampleRateHz / taps);
            if (!(p >= 0) || !Double.isFinite(p)) {
                throw new IllegalArgumentException("density at " + (k * sampleRateHz / taps) + " Hz is " + p
                        + "; expected a finite value >= 0");
            }
            amp[k] = Math.sqrt(p * sampleRateHz / 2);
            if (k > 0 && k < taps / 2) {
                amp[taps - k] = amp[k];
            }
        }
        // zero-phase kernel: inverse DFT of the real, even amplitudes (JTransforms' packed real layout)
        double[] packed = new double[taps];
        packed[0] = amp[0];
        packed[1] = amp[taps / 2];
        for (int k = 1; k < taps / 2; k++) {
            packed[2 * k] = amp[k];
            packed[2 * k + 1] = 0;
        }
        new DoubleFFT_1D(taps).realInverse(packed, true);
        double[] h = new double[taps];
        double sum2 = 0;
        for (int n = 0; n < taps; n++) {
            h[n] = packed[(n + taps / 2) % taps];
            sum2 += h[n] * h[n];
        }
        if (!Double.isNaN(exactPowerV2)) {
            if (!(exactPowerV2 >= 0) || !Double.isFinite(exactPowerV2)) {
                throw new IllegalArgumentException("exactPowerV2=" + exactPowerV2 + " must be finite and >= 0");
            }
            double scale = sum2 > 0 ? Math.sqrt(exactPowerV2 / sum2) : 0;
            for (int n = 0; n < taps; n++) {
                h[n] *= scale;
            }
            sum2 = exactPowerV2;
        }
        varianceV2 = sum2;
        fft = new DoubleFFT_1D(2L * taps);
        kernelSpectrum = new double[2 * taps];
        System.arraycopy(h, 0, kernelSpectrum, 0, taps);
        fft.realForward(kernelSpectrum);
        work = new double[2 * taps];
        overlap = new double[taps];
        ready = new double[taps];
        nextBlock();
        nextBlock();
        readyPos = 0;
    }

    /** The expected output variance, V² (Σh²). */
    public double varianceV2() {
        return varianceV2;
    }

    /** Kernel length L. */
    public int taps() {
        return taps;
    }

    /** Fills {@code out[offset .. offset+n)} with the next n samples, V. */
    public void render(double[] out, int offset, int n) {
        int done = 0;
        while (done < n) {
            if (readyPos == taps) {
                nextBlock();
                readyPos = 0;
            }
            int m = Math.min(n - done, taps - readyPos);
            System.arraycopy(ready, readyPos, out, offset + done, m);
            readyPos += m;
            done += m;
        }
    }

    /** Adds the next n samples to {@code out[offset ..]}. */
    public void add(double[] out, int offset, int n) {
        int done = 0;
        while (done < n) {
            if (readyPos == taps) {
                nextBlock();
                readyPos = 0;
            }
            int m = Math.min(n - done, taps - readyPos);
            for (int i = 0; i < m; i++) {
                out[offset + done + i] += ready[readyPos + i];
            }
            readyPos += m;
            done += m;
        }
    }

    /** One overlap-add block: L new white samples → L output samples. */
    private void nextBlock() {
        white.fill(work, 0, taps);
        java.util.Arrays.fill(work, taps, 2 * taps, 0);
        fft.realForward(work);
        double[] k = kernelSpectrum;
        work[0] *= k[0];
        work[1] *= k[1];
        for (int i = 2; i < 2 * taps; i += 2) {
            double re = work[i] * k[i] - work[i + 1] * k[i + 1];
            double im = work[i] * k[i + 1] + work[i + 1] * k[i];
            work[i] = re;
            work[i + 1] = im;
        }
        fft.realInverse(work, true);
        for (int i = 0; i < taps; i++) {
            ready[i] = work[i] + overlap[i];
            overlap[i] = work[taps + i];
        }
    }
}
