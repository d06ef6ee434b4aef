package org.roseate.spectrum;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;
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
 * segments are then copied into a batch of slots; a full batch goes to {@link SegmentWorkers}'
 * helpers, which detrend, window and transform it (each with its own FFT plan) while the caller
 * fills the next batch. When that one is full (or a result is asked for) the caller transforms
 * whatever of the first batch no helper has claimed yet, waits for the rest and adds its segments
 * to the averages one by one in segment order with the same code as the sequential path. Each segment's transform is the same
 * arithmetic on the same values, and the averages see the same values in the same order, so every
 * result is bitwise the sequential one for any block split and any flush point
 * (WelchParallelTest). Only segments of {@link #PARALLEL_MIN_SEGMENT} to {@link #PARALLEL_MAX_SEGMENT}
 * points on more than one processor use it: shorter transforms cost less than the hand-over, longer
 * ones would need too much memory for the two batches (one filling, one being transformed). The
 * parallel path allocates a few small objects per batch (task, futures); the no-allocation guarantee
 * above is for the sequential path, which live use keeps.
 */
final class WelchCore {
    static {
        CommonUtils.setThreadsBeginN_1D_FFT_2Threads(Long.MAX_VALUE);
        CommonUtils.setThreadsBeginN_1D_FFT_4Threads(Long.MAX_VALUE);
    }

    /** Shortest segment (points) transformed in parallel; below it the hand-over costs more than it saves. */
    static final int PARALLEL_MIN_SEGMENT = 4096;
    /**
     * Longest segment (points) transformed in parallel: the two batches then hold at most four
     * segments, 32 MiB per channel; longer segments stay sequential rather than multiply their memory.
     */
    static final int PARALLEL_MAX_SEGMENT = 1 << 20;
    /** Memory of one batch per channel, in doubles (8 MiB), unless that is less than one slot per lane. */
    private static final int BATCH_DOUBLES = 1 << 20;

    private final int channels;
    private boolean parallelWanted;
    private int lanes;
    private DoubleFFT_1D[] laneFft;
    private double[][][] slots;
    private double[][][] spareSlots;
    private int pending;
    private Batch inFlight;
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
        awaitInFlight();
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
        awaitInFlight();
        pending = 0;
        if (!parallelWanted || SegmentWorkers.helpers() == 0 || n < PARALLEL_MIN_SEGMENT || n > PARALLEL_MAX_SEGMENT) {
            lanes = 1;
            laneFft = null;
            slots = null;
            spareSlots = null;
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
        spareSlots = new double[batch][channels][n];
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
        awaitInFlight();
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

    /** Parallel path: copies the full frame into the next slot; a full batch is handed to the helpers. */
    private void stash() {
        double[][] slot = slots[pending];
        for (int c = 0; c < channels; c++) {
            System.arraycopy(frame[c], 0, slot[c], 0, n);
        }
        pending++;
        if (pending == slots.length) {
            finishInFlight();
            startBatch();
        }
    }

    /**
     * One batch of full segments being transformed: the helpers and (when it finishes the batch) the
     * caller claim slots one at a time, so the work balances itself.
     */
    private final class Batch {
        final double[][][] slots;
        final int count;
        final AtomicInteger next = new AtomicInteger();
        final List<Future<?>> helpers;

        Batch(double[][][] slots, int count) {
            this.slots = slots;
            this.count = count;
            int used = Math.min(lanes - 1, count);
            helpers = new ArrayList<>(used);
            for (int lane = 1; lane <= used; lane++) {
                DoubleFFT_1D plan = laneFft[lane];
                helpers.add(SegmentWorkers.pool().submit(() -> claim(plan)));
            }
        }

        void claim(DoubleFFT_1D plan) {
            for (int i; (i = next.getAndIncrement()) < count; ) {
                for (int c = 0; c < channels; c++) {
                    transform(slots[i][c], slots[i][c], plan);
                }
            }
        }

        /** Transforms what is left on the caller's thread and waits for the helpers; rethrows a failure. */
        void finish() {
            RuntimeException failure = null;
            try {
                claim(laneFft[0]);
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
        }
    }

    /** Hands the pending slots to the helpers as the batch in flight (none may be in flight). */
    private void startBatch() {
        inFlight = new Batch(slots, pending);
        pending = 0;
        double[][][] t = slots;
        slots = spareSlots;
        spareSlots = t;
    }

    /** Completes the batch in flight, if any, and adds its segments to the averages in order. */
    private void finishInFlight() {
        Batch b = inFlight;
        if (b == null) {
            return;
        }
        inFlight = null;
        b.finish();
        for (int i = 0; i < b.count; i++) {
            double[][] slot = b.slots[i];
            average(slot[0], channels == 2 ? slot[1] : null);
        }
    }

    /** Waits for the batch in flight, if any, and drops it (reset, new settings). */
    private void awaitInFlight() {
        Batch b = inFlight;
        if (b != null) {
            inFlight = null;
            b.finish();
        }
    }

    /** Brings the averages up to date: the batch in flight, then the pending slots, all in order. */
    private void settle() {
        finishInFlight();
        if (pending > 0) {
            startBatch();
            finishInFlight();
        }
    }

    /** Adds one transformed segment (tx, and ty for two channels) to the running averages. */
    private void average(double[] tx, double[] ty) {
        long k = ++segments;
        double alpha = settings.averaging() == WelchSettings.Averaging.LINEAR
                ? 1.0 / k : 1.0 / Math.min(k, settings.timeConstantSegments());
        double beta = 1 - alpha;
        // alpha·c·|X|² with c = scale at DC and Nyquist, 2·scale between; (alpha·c) is formed once
        // per segment, which is the same rounding as evaluating alpha * c * p left to right.
        double edge = alpha * scale;
        double inner = alpha * (2 * scale);
        int last = bins - 1;
        if (ty == null) {
            for (int b = 1; b < last; b++) {
                double xr = tx[2 * b];
                double xi = tx[2 * b + 1];
                gxx[b] = beta * gxx[b] + inner * (xr * xr + xi * xi);
            }
        } else {
            for (int b = 1; b < last; b++) {
                addCross(b, beta, inner, tx[2 * b], tx[2 * b + 1], ty[2 * b], ty[2 * b + 1]);
            }
        }
        // DC (real, packed at [0]) and Nyquist (real, packed at [1]); the imaginary parts are zero.
        if (ty == null) {
            gxx[0] = beta * gxx[0] + edge * (tx[0] * tx[0] + 0.0 * 0.0);
            gxx[last] = beta * gxx[last] + edge * (tx[1] * tx[1] + 0.0 * 0.0);
        } else {
            addCross(0, beta, edge, tx[0], 0.0, ty[0], 0.0);
            addCross(last, beta, edge, tx[1], 0.0, ty[1], 0.0);
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

    private void addCross(int b, double beta, double ac, double xr, double xi, double yr, double yi) {
        gxx[b] = beta * gxx[b] + ac * (xr * xr + xi * xi);
        gyy[b] = beta * gyy[b] + ac * (yr * yr + yi * yi);
        gxyRe[b] = beta * gxyRe[b] + ac * (xr * yr + xi * yi);
        gxyIm[b] = beta * gxyIm[b] + ac * (xr * yi - xi * yr);
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
        return segments + (inFlight == null ? 0 : inFlight.count) + pending;
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
