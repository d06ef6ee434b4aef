package org.roseate.spectrum;

import java.util.Objects;
import org.jtransforms.fft.DoubleFFT_1D;
import org.jtransforms.utils.CommonUtils;

/**
 * The shared engine of {@link WelchEstimator} and {@link CrossSpectrumEstimator}: frames one or
 * two channels into overlapping segments (carrying partial segments between calls), detrends,
 * windows, transforms with JTransforms and keeps the running averages Gxx (and Gyy, Gxy).
 *
 * <p>One-sided density scaling as scipy.signal.welch(scaling='density'): P_k = c_k·|X_k|² /
 * (fs·Σw²) with c_k = 1 at DC and Nyquist, 2 between. Cross density as scipy.signal.csd:
 * P_xy = c_k·conj(X_k)·Y_k / (fs·Σw²).
 *
 * <p>It also keeps what the band uncertainty needs: the averaging weights a_s of the segments and
 * their lag sums S_j = Σ_s a_s·a_(s+j) for every lag j whose segments overlap, so that the total
 * squared-window weight W(t) = Σ_s a_s·w²(t − s·hop) of the record gives
 * T_eff = (Σ_t W)² / (fs·Σ_t W²) = (Σw²)² / (fs·(Σw⁴·S_0 + 2·Σ_j r_j·S_j)), with
 * r_j = Σ_i w²(i)·w²(i + j·hop). Not thread-safe.
 *
 * <p><b>Allocation and threads.</b> For power-of-two segment lengths (every length the automatic choice
 * gives) {@link #accept} allocates nothing and runs entirely on the calling thread: JTransforms would
 * by default split 1-D transforms above 8192 points over its thread pool, allocating a task and a
 * future per part on every segment, so this class raises JTransforms' process-wide thresholds for
 * 2- and 4-thread 1-D transforms to {@link Long#MAX_VALUE} when it is first used (every 1-D FFT in the
 * process then runs on its caller's thread; Roseate has no other). Other even lengths go through
 * JTransforms' mixed-radix or Bluestein code, which allocates work arrays on every segment; they work,
 * but without the no-allocation guarantee.
 */
final class WelchCore {
    static {
        CommonUtils.setThreadsBeginN_1D_FFT_2Threads(Long.MAX_VALUE);
        CommonUtils.setThreadsBeginN_1D_FFT_4Threads(Long.MAX_VALUE);
    }

    private final int channels;
    private double sampleRateHz;
    private WelchSettings settings;
    private int n;
    private int hop;
    private int bins;
    private double[] frequencies;
    private double[] window;
    private double scale;
    private double sumW2;
    private double sumW4;
    private double[] lagOverlap;
    private DoubleFFT_1D fft;
    private double[][] frame;
    private int fill;
    private double[] workX;
    private double[] workY;
    private double[] gxx;
    private double[] gyy;
    private double[] gxyRe;
    private double[] gxyIm;
    private long segments;
    private double s0;
    private double[] lagSums;
    private double[] recentWeights;

    WelchCore(int channels) {
        this.channels = channels;
    }

    void prepare(double sampleRateHz, WelchSettings settings) {
        Objects.requireNonNull(settings, "settings");
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
        this.sampleRateHz = sampleRateHz;
        this.settings = settings;
        n = settings.segmentLength();
        hop = settings.hopSamples();
        bins = settings.bins();
        window = settings.window().coefficients(n);
        sumW2 = 0;
        sumW4 = 0;
        for (double w : window) {
            sumW2 += w * w;
            sumW4 += w * w * w * w;
        }
        scale = 1 / (sampleRateHz * sumW2);
        int lags = (n + hop - 1) / hop - 1;
        lagOverlap = new double[lags];
        for (int j = 1; j <= lags; j++) {
            double r = 0;
            for (int i = 0; i + j * hop < n; i++) {
                double a = window[i];
                double b = window[i + j * hop];
                r += a * a * b * b;
            }
            lagOverlap[j - 1] = r;
        }
        fft = new DoubleFFT_1D(n);
        frame = new double[channels][n];
        workX = new double[n];
        workY = channels == 2 ? new double[n] : null;
        frequencies = new double[bins];
        for (int b = 0; b < bins; b++) {
            frequencies[b] = b * sampleRateHz / n;
        }
        gxx = new double[bins];
        gyy = channels == 2 ? new double[bins] : null;
        gxyRe = channels == 2 ? new double[bins] : null;
        gxyIm = channels == 2 ? new double[bins] : null;
        lagSums = new double[lags];
        recentWeights = new double[lags];
        reset();
    }

    boolean prepared() {
        return settings != null;
    }

    void requirePrepared() {
        if (settings == null) {
            throw new IllegalStateException("call prepare(sampleRateHz, settings) first");
        }
    }

    void reset() {
        requirePrepared();
        fill = 0;
        segments = 0;
        s0 = 0;
        java.util.Arrays.fill(gxx, 0);
        if (channels == 2) {
            java.util.Arrays.fill(gyy, 0);
            java.util.Arrays.fill(gxyRe, 0);
            java.util.Arrays.fill(gxyIm, 0);
        }
        java.util.Arrays.fill(lagSums, 0);
        java.util.Arrays.fill(recentWeights, 0);
    }

    /**
     * Takes samples from x (and y) at stride {@code stride}, starting at xOff (yOff), count of them.
     * Checks nothing: callers validate.
     */
    void accept(double[] x, int xOff, double[] y, int yOff, int stride, int count) {
        int done = 0;
        double[] fx = frame[0];
        double[] fy = channels == 2 ? frame[1] : null;
        while (done < count) {
            int m = Math.min(count - done, n - fill);
            int px = xOff + done * stride;
            int py = yOff + done * stride;
            if (stride == 1) {
                System.arraycopy(x, px, fx, fill, m);
                if (fy != null) {
                    System.arraycopy(y, py, fy, fill, m);
                }
            } else {
                for (int i = 0; i < m; i++) {
                    fx[fill + i] = x[px + i * stride];
                }
                if (fy != null) {
                    for (int i = 0; i < m; i++) {
                        fy[fill + i] = y[py + i * stride];
                    }
                }
            }
            fill += m;
            done += m;
            if (fill == n) {
                segment();
                int keep = n - hop;
                System.arraycopy(fx, hop, fx, 0, keep);
                if (fy != null) {
                    System.arraycopy(fy, hop, fy, 0, keep);
                }
                fill = keep;
            }
        }
    }

    private void segment() {
        transform(frame[0], workX);
        if (channels == 2) {
            transform(frame[1], workY);
        }
        long k = ++segments;
        double alpha = settings.averaging() == WelchSettings.Averaging.LINEAR
                ? 1.0 / k : 1.0 / Math.min(k, settings.timeConstantSegments());
        double beta = 1 - alpha;
        for (int b = 0; b < bins; b++) {
            double xr;
            double xi;
            if (b == 0) {
                xr = workX[0];
                xi = 0;
            } else if (b == bins - 1) {
                xr = workX[1];
                xi = 0;
            } else {
                xr = workX[2 * b];
                xi = workX[2 * b + 1];
            }
            double c = (b == 0 || b == bins - 1) ? scale : 2 * scale;
            gxx[b] = beta * gxx[b] + alpha * c * (xr * xr + xi * xi);
            if (channels == 2) {
                double yr;
                double yi;
                if (b == 0) {
                    yr = workY[0];
                    yi = 0;
                } else if (b == bins - 1) {
                    yr = workY[1];
                    yi = 0;
                } else {
                    yr = workY[2 * b];
                    yi = workY[2 * b + 1];
                }
                gyy[b] = beta * gyy[b] + alpha * c * (yr * yr + yi * yi);
                gxyRe[b] = beta * gxyRe[b] + alpha * c * (xr * yr + xi * yi);
                gxyIm[b] = beta * gxyIm[b] + alpha * c * (xr * yi - xi * yr);
            }
        }
        // Weights: every older weight is multiplied by beta, the new one is alpha.
        double b2 = beta * beta;
        s0 = b2 * s0 + alpha * alpha;
        for (int j = 0; j < lagSums.length; j++) {
            lagSums[j] = b2 * lagSums[j] + alpha * beta * recentWeights[j];
        }
        for (int j = recentWeights.length - 1; j > 0; j--) {
            recentWeights[j] = beta * recentWeights[j - 1];
        }
        if (recentWeights.length > 0) {
            recentWeights[0] = alpha;
        }
    }

    private void transform(double[] src, double[] work) {
        double mean = 0;
        if (settings.detrend() == WelchSettings.Detrend.CONSTANT) {
            for (int i = 0; i < n; i++) {
                mean += src[i];
            }
            mean /= n;
        }
        for (int i = 0; i < n; i++) {
            work[i] = (src[i] - mean) * window[i];
        }
        fft.realForward(work);
    }

    long segments() {
        return segments;
    }

    /** 1/S_0: the number of equally weighted independent segments with the same variance. */
    double effectiveAverages() {
        return segments == 0 ? 0 : 1 / s0;
    }

    /** T_eff in seconds (class description); 0 before the first segment. */
    double effectiveDurationSeconds() {
        if (segments == 0) {
            return 0;
        }
        double sq = sumW4 * s0;
        for (int j = 0; j < lagSums.length; j++) {
            sq += 2 * lagOverlap[j] * lagSums[j];
        }
        return sumW2 * sumW2 / (sampleRateHz * sq);
    }

    double sampleRateHz() {
        return sampleRateHz;
    }

    WelchSettings settings() {
        return settings;
    }

    int channels() {
        return channels;
    }

    /** Bin frequencies b·fs/n in Hz, a fresh copy (computed once per prepare: snapshots run often). */
    double[] frequencies() {
        return frequencies.clone();
    }

    double[] gxx() {
        return gxx.clone();
    }

    double[] gyy() {
        return gyy.clone();
    }

    double[] gxyRe() {
        return gxyRe.clone();
    }

    double[] gxyIm() {
        return gxyIm.clone();
    }
}
