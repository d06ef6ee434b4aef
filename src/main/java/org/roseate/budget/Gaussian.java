package org.roseate.budget;

import org.hipparchus.special.Erf;

/**
 * Statistics of a zero-mean Gaussian noise voltage: exceedance of a level, and Rice's rates.
 */
public final class Gaussian {
    private Gaussian() {
    }

    /**
     * P(|x| &gt; level) for x Gaussian with standard deviation {@code sigma}: erfc(level/(√2·σ))
     * (the two-sided tail of the normal distribution; Abramowitz &amp; Stegun 26.2.2 with 7.1.2).
     * 0 when σ = 0 and level &gt; 0.
     *
     * @param level the threshold, ≥ 0, same unit as sigma
     * @param sigma the RMS, ≥ 0
     */
    public static double exceedanceProbability(double level, double sigma) {
        if (sigma == 0) {
            return level > 0 ? 0 : 1;
        }
        return Erf.erfc(level / (Math.sqrt(2) * sigma));
    }

    /**
     * Rice's expected rate of zero crossings (both directions) of a stationary Gaussian process with
     * one-sided density S(f): (1/π)·√(∫(2πf)²S df / ∫S df), per second (S. O. Rice, "Mathematical
     * analysis of random noise", Bell Syst. Tech. J. 23 (1944) and 24 (1945), eq. 3.3-11).
     *
     * @param powerV2   ∫S df, V²
     * @param ratePowerV2PerS2 ∫(2πf)²S df, (V/s)²
     */
    public static double zeroCrossingsPerS(double powerV2, double ratePowerV2PerS2) {
        if (!(powerV2 > 0)) {
            return 0;
        }
        return Math.sqrt(ratePowerV2PerS2 / powerV2) / Math.PI;
    }
}
