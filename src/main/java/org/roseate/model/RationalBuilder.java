package org.roseate.model;

import java.util.List;
import org.roseate.circuit.Component;
import org.roseate.circuit.Network;
import org.roseate.circuit.Parallel;
import org.roseate.circuit.Series;

/**
 * Builds a network's impedance as a ratio of polynomials in x = s/ω0, with impedances divided by
 * a reference resistance: Z_R = R/R0, Z_C = 1/(x·ω0·C·R0), Z_L = x·ω0·L/R0. Series:
 * (N1·D2 + N2·D1)/(D1·D2); parallel: N1·N2/(N1·D2 + N2·D1). Exact factors of x common to both
 * sides (two capacitors in series, two inductors in parallel) are removed exactly.
 */
final class RationalBuilder {
    /** Reference impedance that brings audio-RC coefficients near 1: 10 kΩ (common practice). */
    static final double REFERENCE_OHMS = 1e4;

    private RationalBuilder() {
    }

    /** The impedance; numerator and denominator as a two-element array. */
    static Polynomial[] impedance(Network n, double omegaScaleRadPerS) {
        if (n instanceof Component c) {
            return switch (c.kind()) {
                case RESISTOR -> pair(new Polynomial(c.value() / REFERENCE_OHMS), new Polynomial(1));
                case CAPACITOR -> pair(new Polynomial(1), new Polynomial(0, omegaScaleRadPerS * c.value() * REFERENCE_OHMS));
                case INDUCTOR -> pair(new Polynomial(0, omegaScaleRadPerS * c.value() / REFERENCE_OHMS), new Polynomial(1));
            };
        }
        if (n instanceof Series s) {
            return combine(s.parts(), true, omegaScaleRadPerS);
        }
        return combine(((Parallel) n).parts(), false, omegaScaleRadPerS);
    }

    private static Polynomial[] combine(List<Network> parts, boolean series, double w0) {
        Polynomial[] acc = impedance(parts.get(0), w0);
        for (int i = 1; i < parts.size(); i++) {
            Polynomial[] z = impedance(parts.get(i), w0);
            Polynomial cross = acc[0].times(z[1]).plus(z[0].times(acc[1]));
            acc = series ? pair(cross, acc[1].times(z[1])) : pair(acc[0].times(z[0]), cross);
        }
        return acc;
    }

    /** Removes common exact powers of x and scales so the denominator's largest coefficient is 1. */
    static Polynomial[] pair(Polynomial num, Polynomial den) {
        int k = Math.min(num.lowestPower(), den.lowestPower());
        if (k > 0 && !num.isZero() && !den.isZero()) {
            num = num.shiftDown(k);
            den = den.shiftDown(k);
        }
        double m = den.maxAbsCoefficient();
        if (m > 0 && Double.isFinite(m)) {
            num = num.times(1 / m);
            den = den.times(1 / m);
        }
        return new Polynomial[] {num, den};
    }
}
