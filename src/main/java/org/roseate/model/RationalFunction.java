package org.roseate.model;

/**
 * A rational function H = N(x)/D(x) in the normalised variable x = s/ω0, with
 * ω0 = {@code omegaScaleRadPerS}. Frequency scaling keeps the coefficients of audio RC networks
 * near unity, where root finding is well conditioned.
 */
public record RationalFunction(Polynomial numerator, Polynomial denominator, double omegaScaleRadPerS) {

    /** H at s = j·2π·hz. */
    public Complex evaluateAtHz(double hz) {
        Complex x = new Complex(0, 2 * Math.PI * hz / omegaScaleRadPerS);
        return numerator.evaluate(x).dividedBy(denominator.evaluate(x));
    }

    public RationalFunction times(RationalFunction o) {
        if (o.omegaScaleRadPerS != omegaScaleRadPerS) {
            throw new IllegalArgumentException("scales differ: " + omegaScaleRadPerS + " vs " + o.omegaScaleRadPerS);
        }
        return new RationalFunction(numerator.times(o.numerator), denominator.times(o.denominator), omegaScaleRadPerS);
    }

    /** Proper when deg N ≤ deg D. */
    public boolean isProper() {
        return numerator.degree() <= denominator.degree();
    }
}
