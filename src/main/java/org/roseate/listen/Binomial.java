package org.roseate.listen;

import java.math.BigDecimal;
import java.math.BigInteger;
import java.math.MathContext;

/**
 * Exact one-sided binomial test for an ABX result under the null hypothesis that the listener
 * guesses (success probability ½ per trial).
 *
 * <p>p = P(K ≥ k) = 2⁻ⁿ·Σ_{i=k..n} C(n, i), summed in exact integers and rounded once to double
 * (the definition of the binomial distribution; the same quantity as
 * scipy.stats.binomtest(k, n, 0.5, alternative='greater').pvalue).
 */
public final class Binomial {
    /** Largest number of trials accepted. */
    public static final int MAX_TRIALS = 1000;

    private Binomial() {
    }

    /**
     * P(K ≥ correct) for K ~ Binomial(trials, ½).
     *
     * @param correct 0 ≤ correct ≤ trials
     * @param trials  1 to {@link #MAX_TRIALS}
     * @return the one-sided p-value in (0, 1]
     */
    public static double upperTail(int correct, int trials) {
        check(correct, trials);
        BigInteger sum = BigInteger.ZERO;
        BigInteger c = BigInteger.ONE; // C(n, 0)
        for (int i = 0; i <= trials; i++) {
            if (i >= correct) {
                sum = sum.add(c);
            }
            c = c.multiply(BigInteger.valueOf(trials - i)).divide(BigInteger.valueOf(i + 1));
        }
        return new BigDecimal(sum).divide(new BigDecimal(BigInteger.ONE.shiftLeft(trials)), MathContext.DECIMAL64)
                .doubleValue();
    }

    /**
     * The smallest count of correct answers whose p-value is at most alpha, or trials + 1 when even
     * a perfect score is not (fewer than 5 trials at alpha = 0.05).
     */
    public static int smallestSignificantCount(int trials, double alpha) {
        if (!(alpha > 0 && alpha < 1)) {
            throw new IllegalArgumentException("alpha=" + alpha + " must be in (0, 1)");
        }
        check(0, trials);
        for (int k = 0; k <= trials; k++) {
            if (upperTail(k, trials) <= alpha) {
                return k;
            }
        }
        return trials + 1;
    }

    private static void check(int correct, int trials) {
        if (trials < 1 || trials > MAX_TRIALS) {
            throw new IllegalArgumentException("trials=" + trials + " must be 1 to " + MAX_TRIALS);
        }
        if (correct < 0 || correct > trials) {
            throw new IllegalArgumentException("correct=" + correct + " must be 0 to trials (" + trials + ")");
        }
    }
}
