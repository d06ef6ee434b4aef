package org.roseate.spectrum;

import java.util.Objects;

/**
 * How a Welch estimate is made (Welch, IEEE Trans. Audio Electroacoust. AU-15(2), 1967): the
 * record is cut into segments of {@code segmentLength} samples overlapping by
 * {@code overlapFraction}, each segment is detrended, windowed and transformed, and the
 * periodograms are averaged. Immutable.
 *
 * <p>Averaging: segment k (k = 1, 2, …) enters the running average with weight α_k, average ←
 * (1 − α_k)·average + α_k·periodogram. {@link Averaging#LINEAR} uses α_k = 1/k (the plain mean,
 * as scipy.signal.welch with average='mean'); {@link Averaging#EXPONENTIAL} uses
 * α_k = 1/min(k, timeConstantSegments), so it starts as the mean and then forgets with a time
 * constant of about timeConstantSegments hops (common practice for analyzers).
 *
 * @param segmentLength        samples per segment n, even, 4 … 2^24 (the FFT length; one-sided
 *                             bins are n/2 + 1, spaced sampleRate/n)
 * @param overlapFraction      overlap of consecutive segments, 0 ≤ overlap &lt; 1; the overlap
 *                             in samples is floor(overlapFraction·n), so 0.5 gives n/2 like
 *                             scipy's default noverlap = nperseg // 2
 * @param window               the data window
 * @param averaging            linear (mean) or exponential
 * @param timeConstantSegments for exponential averaging, ≥ 1 (ignored for linear, where it must
 *                             still be ≥ 1)
 * @param detrend              what is removed from each segment before windowing
 */
public record WelchSettings(int segmentLength, double overlapFraction, Window window, Averaging averaging,
        int timeConstantSegments, Detrend detrend) {
    /** Largest segment length accepted: 2^24 samples (about 6 minutes at 48 kHz). */
    public static final int MAX_SEGMENT_LENGTH = 1 << 24;

    /** Linear averaging or exponential forgetting; see the record description. */
    public enum Averaging { LINEAR, EXPONENTIAL }

    /** What is subtracted from each segment before windowing: nothing, or its mean (scipy's default 'constant'). */
    public enum Detrend { NONE, CONSTANT }

    /**
     * @throws IllegalArgumentException naming the bad value
     */
    public WelchSettings {
        Objects.requireNonNull(window, "window");
        Objects.requireNonNull(averaging, "averaging");
        Objects.requireNonNull(detrend, "detrend");
        if (segmentLength < 4 || segmentLength > MAX_SEGMENT_LENGTH || segmentLength % 2 != 0) {
            throw new IllegalArgumentException("segmentLength=" + segmentLength + " must be even, within 4 … "
                    + MAX_SEGMENT_LENGTH);
        }
        if (!(overlapFraction >= 0 && overlapFraction < 1)) {
            throw new IllegalArgumentException("overlapFraction=" + overlapFraction + " must be within [0, 1)");
        }
        if (timeConstantSegments < 1) {
            throw new IllegalArgumentException("timeConstantSegments=" + timeConstantSegments + " must be >= 1");
        }
    }

    /** Hann, 50 % overlap, linear averaging, constant detrend: scipy.signal.welch's defaults. */
    public static WelchSettings of(int segmentLength) {
        return new WelchSettings(segmentLength, 0.5, Window.HANN, Averaging.LINEAR, 1, Detrend.CONSTANT);
    }

    /** A copy with another window. */
    public WelchSettings withWindow(Window w) {
        return new WelchSettings(segmentLength, overlapFraction, w, averaging, timeConstantSegments, detrend);
    }

    /** A copy with another overlap fraction. */
    public WelchSettings withOverlap(double fraction) {
        return new WelchSettings(segmentLength, fraction, window, averaging, timeConstantSegments, detrend);
    }

    /** A copy with another detrend. */
    public WelchSettings withDetrend(Detrend d) {
        return new WelchSettings(segmentLength, overlapFraction, window, averaging, timeConstantSegments, d);
    }

    /** A copy with exponential averaging over about {@code segments} hops. */
    public WelchSettings exponential(int segments) {
        return new WelchSettings(segmentLength, overlapFraction, window, Averaging.EXPONENTIAL, segments, detrend);
    }

    /** Overlap in samples: floor(overlapFraction · segmentLength). */
    public int overlapSamples() {
        return (int) Math.floor(overlapFraction * segmentLength);
    }

    /** Samples between segment starts: segmentLength − overlapSamples(), ≥ 1. */
    public int hopSamples() {
        return segmentLength - overlapSamples();
    }

    /** Number of one-sided bins: n/2 + 1. */
    public int bins() {
        return segmentLength / 2 + 1;
    }
}
