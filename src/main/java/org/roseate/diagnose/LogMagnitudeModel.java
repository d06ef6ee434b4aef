package org.roseate.diagnose;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.roseate.circuit.Design;
import org.roseate.model.CircuitModel;

/**
 * 20·log10|H(j·2π·f)| and arg H of a design with its parts set to nominal·exp(θ), through the exact
 * analog model ({@link CircuitModel}); generic over stage kinds since it only replaces values by
 * designator. Not thread-safe (keeps scratch arrays).
 *
 * <p>What a Hann-windowed FFT estimate expects. A Welch estimate at a bin is not H there but H
 * averaged over the window's power kernel |W(f)|², whose second moment is 1/3 bin² for the Hann
 * window (∫w'²/(4π²·∫w²) with w = sin²(πt/T); our arithmetic, checked numerically). To second
 * order that average is H + (Δf²/6)·H'', which the three-point kernel ⅙·H(f − Δf) + ⅔·H(f) +
 * ⅙·H(f + Δf) reproduces exactly (same weight, mean and second moment). For a transfer estimate
 * (H1 = Gxy/Gxx with a locally flat input) the kernel smooths the complex H; for a noise source's
 * density it smooths |H|². Without it the bias near a corner f_c is about (1/6)·(Δf/f_c)² of the
 * value: 0.1 dB two bins below a corner, ten times the scatter of a minute's capture.
 */
final class LogMagnitudeModel {
    /** Forward-difference step in ln(value) for the Jacobian: 1e-6 (about √ε of the dB values' precision). */
    static final double STEP_LN = 1e-6;
    /** Weights of the three-point Hann kernel (class description): side, centre. */
    private static final double SIDE = 1.0 / 6;
    private static final double CENTRE = 2.0 / 3;

    private final Design design;
    private final String source;
    private final List<PartPrior> parts;
    private final double[] hz;
    private final int points;
    private final boolean smoothed;
    private final boolean smoothPower;
    private final double[] re;
    private final double[] im;

    /** The exact response at each frequency, no window smoothing. */
    LogMagnitudeModel(Design design, String source, List<PartPrior> parts, double[] hz) {
        this(design, source, parts, hz, 0, false);
    }

    /**
     * @param binHz       the FFT bin width Δf the measurement was smoothed over, Hz; 0 for none (a
     *                    swept sine, or the exact response); every frequency must exceed it
     * @param smoothPower true to smooth |H|² (noise-source density), false to smooth H (transfer)
     */
    LogMagnitudeModel(Design design, String source, List<PartPrior> parts, double[] hz, double binHz,
            boolean smoothPower) {
        this.design = design;
        this.source = source;
        this.parts = List.copyOf(parts);
        this.points = hz.length;
        this.smoothed = binHz > 0;
        this.smoothPower = smoothPower;
        if (smoothed) {
            this.hz = new double[3 * points];
            for (int i = 0; i < points; i++) {
                if (!(hz[i] > binHz)) {
                    throw new IllegalArgumentException("point " + hz[i] + " Hz lies within one bin (" + binHz + " Hz) of 0");
                }
                this.hz[3 * i] = hz[i] - binHz;
                this.hz[3 * i + 1] = hz[i];
                this.hz[3 * i + 2] = hz[i] + binHz;
            }
        } else {
            this.hz = hz.clone();
        }
        this.re = new double[this.hz.length];
        this.im = new double[this.hz.length];
    }

    int parts() {
        return parts.size();
    }

    /** The levels in dB at every frequency for log-ratios θ (one per part) into {@code out}. */
    void db(double[] theta, double[] out) {
        response(theta, out, null);
    }

    /** Levels in dB into {@code db} and, unless {@code deg} is null, arg H in degrees, (−180, 180], into {@code deg}. */
    void response(double[] theta, double[] db, double[] deg) {
        Map<String, Double> values = new HashMap<>();
        for (int j = 0; j < parts.size(); j++) {
            values.put(parts.get(j).designator(), parts.get(j).nominal() * Math.exp(theta[j]));
        }
        CircuitModel.of(design.withValues(values), source).response(hz, re, im);
        for (int i = 0; i < points; i++) {
            double r;
            double x;
            double power;
            if (!smoothed) {
                r = re[i];
                x = im[i];
                power = r * r + x * x;
            } else {
                int a = 3 * i;
                r = SIDE * (re[a] + re[a + 2]) + CENTRE * re[a + 1];
                x = SIDE * (im[a] + im[a + 2]) + CENTRE * im[a + 1];
                power = smoothPower ? SIDE * (re[a] * re[a] + im[a] * im[a] + re[a + 2] * re[a + 2] + im[a + 2] * im[a + 2])
                        + CENTRE * (re[a + 1] * re[a + 1] + im[a + 1] * im[a + 1]) : r * r + x * x;
            }
            db[i] = 10 * Math.log10(power);
            if (deg != null) {
                deg[i] = Math.toDegrees(Math.atan2(x, r));
            }
        }
    }

    /** Levels at θ into {@code db}, and ∂dB/∂θ_j into {@code jac[i][j]} by forward differences. */
    void dbAndJacobian(double[] theta, double[] db, double[][] jac) {
        responseAndJacobian(theta, db, jac, null, null);
    }

    /**
     * Levels and phases at θ with their Jacobians by forward differences (phase differences wrapped
     * to ±180°); {@code deg} and {@code jacDeg} may be null for magnitude only.
     */
    void responseAndJacobian(double[] theta, double[] db, double[][] jac, double[] deg, double[][] jacDeg) {
        response(theta, db, deg);
        double[] t = theta.clone();
        double[] shifted = new double[points];
        double[] shiftedDeg = deg == null ? null : new double[points];
        for (int j = 0; j < parts.size(); j++) {
            t[j] = theta[j] + STEP_LN;
            response(t, shifted, shiftedDeg);
            for (int i = 0; i < points; i++) {
                jac[i][j] = (shifted[i] - db[i]) / STEP_LN;
                if (deg != null) {
                    jacDeg[i][j] = wrapDeg(shiftedDeg[i] - deg[i]) / STEP_LN;
                }
            }
            t[j] = theta[j];
        }
    }

    /** An angle in degrees wrapped to (−180, 180]. */
    static double wrapDeg(double d) {
        double w = d - 360 * Math.floor((d + 180) / 360);
        return w == -180 ? 180 : w;
    }
}
