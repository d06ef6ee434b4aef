package org.roseate.model;

import java.util.function.DoubleUnaryOperator;

/**
 * ∫ P(f) df over a band, for a smooth power response P = |H|². Composite 8-point Gauss–Legendre
 * quadrature in u = ln f (df = f·du), with sub-intervals no wider than 0.05 in ln f (about
 * 1/14 octave): for RC networks, whose features are no sharper than a few tenths of an octave,
 * the result is exact to far below 1e-6 dB (checked against closed forms in the tests).
 * Nodes and weights: Abramowitz &amp; Stegun, Handbook of Mathematical Functions, table 25.4.
 */
public final class BandPower {
    private static final double[] NODES = {
        0.1834346424956498, 0.5255324099163290, 0.7966664774136267, 0.9602898564975363,
    };
    private static final double[] WEIGHTS = {
        0.3626837833783620, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763,
    };
    private static final double MAX_STEP_LN = 0.05;

    private BandPower() {
    }

    /** ∫ from lowHz to highHz of power(f) df; 0 &lt; lowHz &lt; highHz. */
    public static double integrate(DoubleUnaryOperator power, double lowHz, double highHz) {
        if (!(lowHz > 0) || !(highHz > lowHz) || !Double.isFinite(highHz)) {
            throw new IllegalArgumentException("band " + lowHz + "-" + highHz + " Hz must satisfy 0 < low < high");
        }
        double a = Math.log(lowHz);
        double b = Math.log(highHz);
        int m = Math.max(1, (int) Math.ceil((b - a) / MAX_STEP_LN));
        double h = (b - a) / m;
        double sum = 0;
        for (int k = 0; k < m; k++) {
            double mid = a + (k + 0.5) * h;
            double half = 0.5 * h;
            double s = 0;
            for (int i = 0; i < NODES.length; i++) {
                double u1 = mid - half * NODES[i];
                double u2 = mid + half * NODES[i];
                double f1 = Math.exp(u1);
                double f2 = Math.exp(u2);
                s += WEIGHTS[i] * (power.applyAsDouble(f1) * f1 + power.applyAsDouble(f2) * f2);
            }
            sum += s * half;
        }
        return sum;
    }

    /** 10·log10 of {@link #integrate}, in dB. */
    public static double levelDb(DoubleUnaryOperator power, double lowHz, double highHz) {
        return 10 * Math.log10(integrate(power, lowHz, highHz));
    }
}
