package org.roseate.compare;

/**
 * How a set of band deviations is centred, and the peak that follows.
 *
 * <p>Two rules:
 * <ul>
 *   <li>{@link #of(double[])}: minimax, for a design's exact model: the one offset that makes the
 *       largest and smallest deviation equal and opposite, offset = −(max + min)/2,
 *       peak = (max − min)/2. It is what a filter designer minimises.</li>
 *   <li>{@link #weighted(double[], double[], boolean[])}: for measurements, whose bands carry random
 *       error: the offset is minus the inverse-variance weighted mean of the included deviations,
 *       offset = −Σ wᵢ·rawᵢ / Σ wᵢ with wᵢ = 1/σᵢ² (the minimum-variance estimate of a common level,
 *       Bevington and Robinson, Data Reduction and Error Analysis, 3rd ed., eq. 4.17, from memory);
 *       peak = max over included bands of |rawᵢ + offset|. One noisy band then moves the others only
 *       by its small weight, where the minimax rule would move them by half its error.</li>
 * </ul>
 *
 * @param offsetDb        added to every raw deviation, dB
 * @param peakDb          the largest centred deviation in magnitude over the bands that count, dB
 * @param peakIndex       the band holding the peak, or −1 (none included)
 * @param weightSumPerDb2 Σ wᵢ (1/dB²) over the included bands for the weighted rule; the weighted mean
 *                        then has variance 1/Σ wᵢ. NaN for the minimax rule
 */
public record Centering(double offsetDb, double peakDb, int peakIndex, double weightSumPerDb2) {
    /** The minimax centring of every value (for designs). */
    public static Centering of(double[] rawDb) {
        double max = Double.NEGATIVE_INFINITY;
        double min = Double.POSITIVE_INFINITY;
        int at = -1;
        for (double d : rawDb) {
            max = Math.max(max, d);
            min = Math.min(min, d);
        }
        double offset = -(max + min) / 2;
        for (int i = 0; i < rawDb.length; i++) {
            if (at < 0 || Math.abs(rawDb[i] + offset) > Math.abs(rawDb[at] + offset)) {
                at = i;
            }
        }
        return new Centering(offset, (max - min) / 2, at, Double.NaN);
    }

    /**
     * The inverse-variance weighted centring of measured deviations.
     *
     * @param rawDb    deviations before centring, dB
     * @param sigmaDb  one-standard-deviation uncertainty of each, dB (&gt; 0 where included); when
     *                 none of the included bands has a finite positive σ, every included band
     *                 weighs the same (a plain mean) and {@link #weightSumPerDb2} is NaN
     * @param included which bands enter the mean and the peak (null: all)
     * @throws IllegalArgumentException if the lengths differ
     */
    public static Centering weighted(double[] rawDb, double[] sigmaDb, boolean[] included) {
        if (sigmaDb.length != rawDb.length || included != null && included.length != rawDb.length) {
            throw new IllegalArgumentException(rawDb.length + " deviations, " + sigmaDb.length + " uncertainties"
                    + (included == null ? "" : ", " + included.length + " flags"));
        }
        boolean allWeighted = true;
        int count = 0;
        for (int i = 0; i < rawDb.length; i++) {
            if (included == null || included[i]) {
                count++;
                allWeighted &= sigmaDb[i] > 0 && Double.isFinite(sigmaDb[i]);
            }
        }
        if (count == 0) {
            return new Centering(0, Double.NaN, -1, Double.NaN);
        }
        double sw = 0;
        double swx = 0;
        for (int i = 0; i < rawDb.length; i++) {
            if (included == null || included[i]) {
                double w = allWeighted ? 1 / (sigmaDb[i] * sigmaDb[i]) : 1;
                sw += w;
                swx += w * rawDb[i];
            }
        }
        double offset = -swx / sw;
        int at = -1;
        for (int i = 0; i < rawDb.length; i++) {
            if ((included == null || included[i]) && (at < 0 || Math.abs(rawDb[i] + offset) > Math.abs(rawDb[at] + offset))) {
                at = i;
            }
        }
        return new Centering(offset, Math.abs(rawDb[at] + offset), at, allWeighted ? sw : Double.NaN);
    }

    /** rawᵢ + offset for every band. */
    public double[] apply(double[] rawDb) {
        double[] out = new double[rawDb.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = rawDb[i] + offsetDb;
        }
        return out;
    }

    /**
     * One standard deviation of the centred deviation of band i under the weighted rule:
     * var(rawᵢ − m) = σᵢ² − 1/Σw for an included band (its own error is part of the mean m, so the
     * covariance cov(rawᵢ, m) = 1/Σw cancels part of it), σᵢ² + 1/Σw for a band outside the mean.
     * NaN for the minimax rule or a missing σ.
     */
    public double centredSigmaDb(double sigmaDb, boolean includedInMean) {
        if (Double.isNaN(weightSumPerDb2) || !(sigmaDb > 0)) {
            return Double.NaN;
        }
        double v = includedInMean ? sigmaDb * sigmaDb - 1 / weightSumPerDb2 : sigmaDb * sigmaDb + 1 / weightSumPerDb2;
        return Math.sqrt(Math.max(0, v));
    }
}
