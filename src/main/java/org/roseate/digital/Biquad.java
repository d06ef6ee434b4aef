package org.roseate.digital;

import org.roseate.model.Complex;

/**
 * One second-order section, a0 = 1, coefficients in descending powers of z⁻¹ (see package-info).
 *
 * @param b0 numerator coefficient of z⁰
 * @param b1 numerator coefficient of z⁻¹
 * @param b2 numerator coefficient of z⁻²
 * @param a1 denominator coefficient of z⁻¹
 * @param a2 denominator coefficient of z⁻²
 */
public record Biquad(double b0, double b1, double b2, double a1, double a2) {
    public Biquad {
        if (!(Double.isFinite(b0) && Double.isFinite(b1) && Double.isFinite(b2)
                && Double.isFinite(a1) && Double.isFinite(a2))) {
            throw new IllegalArgumentException("biquad coefficients must be finite: b=[" + b0 + ", " + b1
                    + ", " + b2 + "] a=[1, " + a1 + ", " + a2 + "]");
        }
    }

    /**
     * H(e^{jω}) of this section.
     *
     * @param omegaRadPerSample normalised angular frequency ω = 2π·f/fs in rad/sample, any finite value
     */
    public Complex response(double omegaRadPerSample) {
        double c1 = Math.cos(omegaRadPerSample);
        double s1 = -Math.sin(omegaRadPerSample);
        double c2 = Math.cos(2 * omegaRadPerSample);
        double s2 = -Math.sin(2 * omegaRadPerSample);
        Complex num = new Complex(b0 + b1 * c1 + b2 * c2, b1 * s1 + b2 * s2);
        Complex den = new Complex(1 + a1 * c1 + a2 * c2, a1 * s1 + a2 * s2);
        return num.dividedBy(den);
    }

    /** This section with its numerator multiplied by {@code factor} (the poles are unchanged). */
    public Biquad scaledBy(double factor) {
        return new Biquad(b0 * factor, b1 * factor, b2 * factor, a1, a2);
    }

    /** Number of poles away from z = 0: 2 if a2 ≠ 0, 1 if only a1 ≠ 0, else 0. */
    public int order() {
        return a2 != 0 ? 2 : (a1 != 0 ? 1 : 0);
    }
}
