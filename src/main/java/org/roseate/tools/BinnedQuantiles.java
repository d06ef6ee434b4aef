package org.roseate.tools;

/**
 * Streaming percentiles in constant memory: a fixed-bin histogram of values in dB with bins
 * {@value #BIN_DB} dB wide over {@value #BINS} bins (65.5 dB) from a chosen lower edge, plus
 * counts below and above that span.
 *
 * <p>Estimator: the order statistic of (0-based) rank k is taken as the centre of the bin that
 * holds it (the smallest and largest exactly, as they are kept), found from the cumulative counts; a percentile at rank r = p·(n − 1) interpolates
 * linearly between the estimates of ranks ⌊r⌋ and ⌊r⌋ + 1, as numpy's default "linear" method does
 * between the exact order statistics. Each order statistic lies in its bin, so its estimate is off
 * by at most half a bin; a linear interpolation of two such estimates is off by at most the same.
 * <b>Error bound: |estimate − sample percentile of the same values| ≤ {@value #ERROR_DB} dB</b>, for
 * any distribution, as long as the order statistics needed lie inside the span (otherwise the
 * estimate is NaN: refused rather than guessed). The standard errors use the same ranks as
 * {@link Quantiles#standardError} and carry the same bound.
 *
 * <p>Memory: {@value #BINS} ints (256 KiB) per instance, whatever the count. Not thread-safe;
 * {@link #add(double)} allocates nothing.
 */
public final class BinnedQuantiles {
    /** Bin width, dB. */
    public static final double BIN_DB = 0.001;
    /** Number of bins: the span is BINS·BIN_DB = 65.536 dB. */
    public static final int BINS = 1 << 16;
    /** The stated error bound of every estimate, dB: half a bin. */
    public static final double ERROR_DB = BIN_DB / 2;

    private final double lowDb;
    private final int[] counts = new int[BINS];
    private long below;
    private long above;
    private long n;
    private double min = Double.POSITIVE_INFINITY;
    private double max = Double.NEGATIVE_INFINITY;

    /** @param lowDb the lower edge of the span, dB, finite */
    public BinnedQuantiles(double lowDb) {
        if (!Double.isFinite(lowDb)) {
            throw new IllegalArgumentException("lowDb=" + lowDb + " must be finite");
        }
        this.lowDb = lowDb;
    }

    /** A histogram whose span is centred on {@code centreDb}. */
    public static BinnedQuantiles centredOn(double centreDb) {
        return new BinnedQuantiles(centreDb - BINS * BIN_DB / 2);
    }

    /** Counts one value (NaN counts above the span, so it can never pass unseen). */
    public void add(double db) {
        n++;
        if (db < min) {
            min = db;
        }
        if (db > max || Double.isNaN(db)) {
            max = Double.isNaN(db) ? Double.NaN : db;
        }
        double x = (db - lowDb) / BIN_DB;
        if (x < 0) {
            below++;
        } else if (x < BINS) {
            counts[(int) x]++;
        } else {
            above++;
        }
    }

    /** Adds another histogram's counts (same lower edge). */
    public void merge(BinnedQuantiles o) {
        if (o.lowDb != lowDb) {
            throw new IllegalArgumentException("spans differ: " + o.lowDb + " vs " + lowDb);
        }
        for (int i = 0; i < BINS; i++) {
            counts[i] += o.counts[i];
        }
        below += o.below;
        above += o.above;
        n += o.n;
        min = Math.min(min, o.min);
        max = Double.isNaN(o.max) || Double.isNaN(max) ? Double.NaN : Math.max(max, o.max);
    }

    public long count() {
        return n;
    }

    /** The exact smallest value added, dB. */
    public double min() {
        return min;
    }

    /** The exact largest value added, dB (NaN if a NaN was added). */
    public double max() {
        return max;
    }

    /** Values outside the span. */
    public long outsideSpan() {
        return below + above;
    }

    /** The lower edge of bin i, dB. */
    public double binLowDb(int i) {
        return lowDb + i * BIN_DB;
    }

    /** The count of bin i. */
    public int binCount(int i) {
        return counts[i];
    }

    /** The estimate of the order statistic of 0-based rank k, or NaN when it lies outside the span. */
    public double orderStatistic(long k) {
        if (k < 0 || k >= n) {
            throw new IllegalArgumentException("rank " + k + " outside 0 … " + (n - 1));
        }
        if (k == 0) {
            return min;
        }
        if (k == n - 1) {
            return max;
        }
        if (k < below) {
            return Double.NaN;
        }
        long c = below;
        for (int i = 0; i < BINS; i++) {
            c += counts[i];
            if (c > k) {
                return lowDb + (i + 0.5) * BIN_DB;
            }
        }
        return Double.NaN;
    }

    /** The p-percentile estimate, 0 ≤ p ≤ 1 (see the class comment); NaN when outside the span. */
    public double percentile(double p) {
        if (!(p >= 0 && p <= 1)) {
            throw new IllegalArgumentException("p=" + p + " must be within [0, 1]");
        }
        if (n == 0) {
            throw new IllegalStateException("an empty sample has no percentiles");
        }
        double r = p * (n - 1);
        long k = (long) Math.floor(r);
        double a = orderStatistic(k);
        if (k >= n - 1 || r == k) {
            return a;
        }
        double b = orderStatistic(k + 1);
        return a + (r - k) * (b - a);
    }

    /** The order-statistic standard error of the p-quantile, as {@link Quantiles#standardError}. */
    public double standardError(double p) {
        double centre = n * p;
        double half = Math.sqrt(n * p * (1 - p));
        long lo = (long) Math.max(0, Math.min(n - 1, Math.floor(centre - half)));
        long hi = (long) Math.max(0, Math.min(n - 1, Math.ceil(centre + half)));
        return (orderStatistic(hi) - orderStatistic(lo)) / 2;
    }

    /** The 5/50/95 % percentiles and their standard errors. */
    public Quantiles quantiles() {
        return new Quantiles(percentile(0.05), percentile(0.5), percentile(0.95),
                standardError(0.05), standardError(0.5), standardError(0.95));
    }
}
