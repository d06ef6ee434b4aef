package org.roseate.spectrum;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.Future;
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
 *
 * <p><b>Parallel transforms</b> ({@link #parallel}, off by default; file jobs turn it on). Full
 * segments are then copied into a batch of slots; when the batch is full (or a result is asked for)
 * the caller's thread and {@link SegmentWorkers}' helpers detrend, window and transform the slots,
 * each lane with its own FFT plan, and the caller then adds them to the averages one by one in
 * segment order with the same code as the sequential path. Each segment's transform is the same
 * arithmetic on the same values, and the averages see the same values in the same order, so every
 * result is bitwise the sequential one for any block split and any flush point
 * (WelchParallelTest). Only segments of at least {@link #PARALLEL_MIN_SEGMENT} points on more than
 * one processor use it: shorter transforms cost less than the hand-over.
 */
final class WelchCore {
    static {
        CommonUtils.setThreadsBeginN_1D_FFT_2Threads(Long.MAX_VALUE);
        CommonUtils.setThreadsBeginN_1D_FFT_4Threads(Long.MAX_VALUE);
    }

    /** Shortest segment (points) transformed in parallel; below it the hand-over costs more than it saves. */
    static final int PARALLEL_MIN_SEGMENT = 4096;
    /** Batch memory per channel, in doubles (8 MiB): bounds the slots for long segments. */
    private static final int BATCH_DOUBLES = 1 << 20;

    private final int channels;
    private boolean parallelWanted;
    private int lanes;
    private DoubleFFT_1D[] laneFft;
    private double[][][] slots;
    private int pending;
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
        setUpLanes();
        reset();
    }

    /**
     * Turns parallel transforms on or off (class description). Pending segments are settled first,
     * so the results stay the sequential ones; may be called before or after {@link #prepare}.
     */
    void parallel(boolean on) {
        if (settings != null) {
            settle();
        }
        parallelWanted = on;
        if (settings != null) {
            setUpLanes();
        }
    }

    /** Whether segments are being transformed in parallel (wanted, long enough, more than one processor). */
    boolean parallelActive() {
        return lanes > 1;
    }

    private void setUpLanes() {
        pending = 0;
        if (!parallelWanted || SegmentWorkers.helpers() == 0 || n < PARALLEL_MIN_SEGMENT) {
            lanes = 1;
            laneFft = null;
            slots = null;
            return;
        }
        lanes = 1 + SegmentWorkers.helpers();
        int batch = Math.max(lanes, Math.min(4 * lanes, BATCH_DOUBLES / n / lanes * lanes));
        laneFft = new DoubleFFT_1D[lanes];
        laneFft[0] = fft;
        for (int i = 1; i < lanes; i++) {
            laneFft[i] = new DoubleFFT_1D(n);
        }
        slots = new double[batch][channels][n];
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
        pending = 0;
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
                if (lanes > 1) {
                    stash();
                } else {
                    segment();
                }
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
        transform(frame[0], workX, fft);
        if (channels == 2) {
            transform(frame[1], workY, fft);
        }
        average(workX, workY);
    }

    /** Parallel path: copies the full frame into the next slot; a full batch is transformed and averaged. */
    private void stash() {
        double[][] slot = slots[pending];
        for (int c = 0; c < channels; c++) {
            System.arraycopy(frame[c], 0, slot[c], 0, n);
        }
        pending++;
        if (pending == slots.length) {
            settle();
        }
    }

    /** Transforms the pending slots on all lanes, then adds them to the averages in segment order. */
    private void settle() {
        int count = pending;
        if (count == 0) {
            return;
        }
        pending = 0;
        int used = Math.min(lanes, count);
        List<Future<?>> helpers = new ArrayList<>(used - 1);
        for (int lane = 1; lane < used; lane++) {
            int l = lane;
            helpers.add(SegmentWorkers.pool().submit(() -> transformLane(l, used, count)));
        }
        RuntimeException failure = null;
        try {
            transformLane(0, used, count);
        } catch (RuntimeException e) {
            failure = e;
        }
        boolean interrupted = false;
        for (Future<?> f : helpers) {
            while (true) {
                try {
                    f.get();
                    break;
                } catch (InterruptedException e) {
                    interrupted = true;
                } catch (ExecutionException e) {
                    if (failure == null) {
                        Throwable t = e.getCause();
                        failure = t instanceof RuntimeException r ? r : new IllegalStateException(t);
                    }
                    break;
                }
            }
        }
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
        if (failure != null) {
            throw failure;
        }
        for (int i = 0; i < count; i++) {
            double[][] slot = slots[i];
            average(slot[0], channels == 2 ? slot[1] : null);
        }
    }

    /** Lane {@code lane} of {@code used} transforms slots lane, lane + used, ... below count, in place. */
    private void transformLane(int lane, int used, int count) {
        DoubleFFT_1D plan = laneFft[lane];
        for (int i = lane; i < count; i += used) {
            for (int c = 0; c < channels; c++) {
                transform(slots[i][c], slots[i][c], plan);
            }
        }
    }

    /** Adds one transformed segment (tx, and ty for two channels) to the running averages. */
    private void average(double[] tx, double[] ty) {
        double[] workX = tx;
        double[] workY = ty;
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

    /** Detrends and windows src into work (the two may be one array) and transforms work in place. */
    private void transform(double[] src, double[] work, DoubleFFT_1D plan) {
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
        plan.realForward(work);
    }

    /** Full segments taken so far (those waiting in a parallel batch included). */
    long segments() {
        return segments + pending;
    }

    /** 1/S_0: the number of equally weighted independent segments with the same variance. */
    double effectiveAverages() {
        settle();
        return segments == 0 ? 0 : 1 / s0;
    }

    /** T_eff in seconds (class description); 0 before the first segment. */
    double effectiveDurationSeconds() {
        settle();
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
        settle();
        return gxx.clone();
    }

    double[] gyy() {
        settle();
        return gyy.clone();
    }

    double[] gxyRe() {
        settle();
        return gxyRe.clone();
    }

    double[] gxyIm() {
        settle();
        return gxyIm.clone();
    }
}
