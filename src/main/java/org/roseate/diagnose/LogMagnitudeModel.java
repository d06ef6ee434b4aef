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
 */
final class LogMagnitudeModel {
    /** Forward-difference step in ln(value) for the Jacobian: 1e-6 (about √ε of the dB values' precision). */
    static final double STEP_LN = 1e-6;

    private final Design design;
    private final String source;
    private final List<PartPrior> parts;
    private final double[] hz;
    private final double[] re;
    private final double[] im;

    LogMagnitudeModel(Design design, String source, List<PartPrior> parts, double[] hz) {
        this.design = design;
        this.source = source;
        this.parts = List.copyOf(parts);
        this.hz = hz.clone();
        this.re = new double[hz.length];
        this.im = new double[hz.length];
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
        for (int i = 0; i < hz.length; i++) {
            db[i] = 10 * Math.log10(re[i] * re[i] + im[i] * im[i]);
            if (deg != null) {
                deg[i] = Math.toDegrees(Math.atan2(im[i], re[i]));
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
        double[] shifted = new double[hz.length];
        double[] shiftedDeg = deg == null ? null : new double[hz.length];
        for (int j = 0; j < parts.size(); j++) {
            t[j] = theta[j] + STEP_LN;
            response(t, shifted, shiftedDeg);
            for (int i = 0; i < hz.length; i++) {
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
