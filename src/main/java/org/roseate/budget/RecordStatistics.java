package org.roseate.budget;

/**
 * What can be counted in one channel of a rendered record of volts, to set against
 * {@link VoltsRender.Expectation}: the RMS, the RMS of the first difference × fs (the sampled rate
 * of change), and the sign changes between neighbouring samples (zero crossings), the latter also per
 * segment so their scatter gives a standard error. Streaming, constant memory; not thread-safe.
 */
public final class RecordStatistics {
    /** Segments for the crossings' standard error. */
    public static final int SEGMENTS = 16;

    private final double fs;
    private final long totalFrames;
    private final long[] segmentCrossings = new long[SEGMENTS];
    private long count;
    private double sumSq;
    private double sumDiffSq;
    private long crossings;
    private double previous = Double.NaN;

    /**
     * @param sampleRateHz fs, Hz
     * @param totalFrames  the record's length, frames (sets the segments), ≥ 2
     */
    public RecordStatistics(double sampleRateHz, long totalFrames) {
        if (totalFrames < 2) {
            throw new IllegalArgumentException("totalFrames=" + totalFrames + " must be >= 2");
        }
        this.fs = sampleRateHz;
        this.totalFrames = totalFrames;
    }

    /** Adds samples {@code buf[offset + k·stride]}, k = 0 … n−1, volts. */
    public void accept(double[] buf, int offset, int stride, int n) {
        for (int k = 0; k < n; k++) {
            double v = buf[offset + k * stride];
            sumSq += v * v;
            if (count > 0) {
                double d = v - previous;
                sumDiffSq += d * d;
                if ((v < 0) != (previous < 0)) {
                    crossings++;
                    segmentCrossings[(int) Math.min(SEGMENTS - 1, count * SEGMENTS / totalFrames)]++;
                }
            }
            previous = v;
            count++;
        }
    }

    public long count() {
        return count;
    }

    /** √(Σv²/n), V. */
    public double rmsV() {
        return Math.sqrt(sumSq / count);
    }

    /** √(Σ(v_n − v_{n−1})²/(n−1))·fs, V/s. */
    public double sampledRateRmsVPerS() {
        return Math.sqrt(sumDiffSq / (count - 1)) * fs;
    }

    /** Sign changes per second. */
    public double crossingsPerS() {
        return crossings / ((count - 1) / fs);
    }

    /**
     * Standard error of {@link #crossingsPerS()} from the scatter of the {@value #SEGMENTS} segments'
     * rates (the batch-means estimate; valid when a segment is long against the signal's correlation
     * time), 1/s.
     */
    public double crossingsStandardErrorPerS() {
        double segSeconds = totalFrames / fs / SEGMENTS;
        double mean = 0;
        for (long c : segmentCrossings) {
            mean += c / segSeconds;
        }
        mean /= SEGMENTS;
        double ss = 0;
        for (long c : segmentCrossings) {
            double r = c / segSeconds - mean;
            ss += r * r;
        }
        return Math.sqrt(ss / (SEGMENTS - 1) / SEGMENTS);
    }
}
