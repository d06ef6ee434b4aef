package org.roseate.diagnose;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.roseate.circuit.Design;
import org.roseate.model.CircuitModel;

/**
 * 20·log10|H(j·2π·f)| of a design with its parts set to nominal·exp(θ), through the exact analog
 * model ({@link CircuitModel}); generic over stage kinds since it only replaces values by
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
        Map<String, Double> values = new HashMap<>();
        for (int j = 0; j < parts.size(); j++) {
            values.put(parts.get(j).designator(), parts.get(j).nominal() * Math.exp(theta[j]));
        }
        CircuitModel.of(design.withValues(values), source).response(hz, re, im);
        for (int i = 0; i < hz.length; i++) {
            out[i] = 10 * Math.log10(re[i] * re[i] + im[i] * im[i]);
        }
    }

    /** Levels at θ into {@code db}, and ∂dB/∂θ_j into {@code jac[i][j]} by forward differences. */
    void dbAndJacobian(double[] theta, double[] db, double[][] jac) {
        db(theta, db);
        double[] t = theta.clone();
        double[] shifted = new double[hz.length];
        for (int j = 0; j < parts.size(); j++) {
            t[j] = theta[j] + STEP_LN;
            db(t, shifted);
            for (int i = 0; i < hz.length; i++) {
                jac[i][j] = (shifted[i] - db[i]) / STEP_LN;
            }
            t[j] = theta[j];
        }
    }
}
