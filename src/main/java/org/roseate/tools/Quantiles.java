package org.roseate.tools;

import java.util.Arrays;

/**
 * The 5th, 50th and 95th percentiles of a sample with their standard errors.
 *
 * <p>Percentile: linear interpolation between order statistics at rank p·(n − 1) (numpy's
 * default "linear" method). Standard error: distribution-free, from the binomial law of the
 * number of sample points below the true quantile: that count has mean n·p and standard
 * deviation √(n·p·(1 − p)), so the order statistics one such deviation either side bracket the
 * quantile with about 68 % confidence and half their distance estimates its standard error
 * (the order-statistic interval, from memory of the nonparametric-statistics texts).
 *
 * @param p5   5th percentile
 * @param p50  median
 * @param p95  95th percentile
 * @param se5  standard error of p5
 * @param se50 standard error of p50
 * @param se95 standard error of p95
 */
public record Quantiles(double p5, double p50, double p95, double se5, double se50, double se95) {

    /** The percentiles of {@code sample} (n ≥ 1; not modified). */
    public static Quantiles of(double[] sample) {
        if (sample.length == 0) {
            throw new IllegalArgumentException("an empty sample has no percentiles");
        }
        double[] s = sample.clone();
        Arrays.sort(s);
        return new Quantiles(percentile(s, 0.05), percentile(s, 0.5), percentile(s, 0.95),
                standardError(s, 0.05), standardError(s, 0.5), standardError(s, 0.95));
    }

    /** Linear-interpolation percentile of a sorted sample, 0 ≤ p ≤ 1. */
    public static double percentile(double[] sorted, double p) {
        if (!(p >= 0 && p <= 1)) {
            throw new IllegalArgumentException("p=" + p + " must be within [0, 1]");
        }
        double r = p * (sorted.length - 1);
        int k = (int) Math.floor(r);
        if (k >= sorted.length - 1) {
            return sorted[sorted.length - 1];
        }
        return sorted[k] + (r - k) * (sorted[k + 1] - sorted[k]);
    }

    /** The order-statistic standard error of the p-quantile of a sorted sample (see the class comment). */
    public static double standardError(double[] sorted, double p) {
        int n = sorted.length;
        double centre = n * p;
        double half = Math.sqrt(n * p * (1 - p));
        int lo = (int) Math.max(0, Math.min(n - 1, Math.floor(centre - half)));
        int hi = (int) Math.max(0, Math.min(n - 1, Math.ceil(centre + half)));
        return (sorted[hi] - sorted[lo]) / 2;
    }
}
