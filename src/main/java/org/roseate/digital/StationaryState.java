package org.roseate.digital;

import java.util.List;
import java.util.function.DoubleSupplier;

/**
 * The steady state of a {@link SosDesign} driven by unit-variance white noise: the covariance of its
 * state vector and draws from it, so a filter can start as if it had been running forever.
 *
 * <p><b>State space.</b> The cascade state is x = [s1₀, s2₀, s1₁, s2₁, …] (the recursion of
 * {@link SosFilter}, transposed direct form II). One sample step is x' = A·x + B·u with u the input:
 * section k's input is section k−1's output y_{k−1} = c_{k−1}·x + d_{k−1}·u, its output
 * y_k = b0_k·y_{k−1} + s1_k, and s1_k' = b1_k·y_{k−1} − a1_k·y_k + s2_k, s2_k' = b2_k·y_{k−1} − a2_k·y_k.
 *
 * <p><b>Covariance.</b> For white input of variance 1 and a stable cascade the stationary covariance P
 * solves the discrete Lyapunov equation P = A·P·Aᵀ + B·Bᵀ (the state-covariance recursion of any
 * linear state-space model; e.g. Kailath, Sayed and Hassibi, Linear Estimation, 2000, from memory).
 * It is computed by the doubling iteration P ← P + Aₖ·P·Aₖᵀ, Aₖ₊₁ = Aₖ² (Smith, "Matrix equation
 * XA + BX = C", SIAM J. Appl. Math. 16, 1968, from memory), which sums the series Σ Aⁱ·B·Bᵀ·Aⁱᵀ in
 * log₂ of its length steps with only non-negative terms, so it stays accurate for poles within 1e-7 of
 * the unit circle (a 10 s time constant at 768 kHz). Checked against scipy.linalg.solve_discrete_lyapunov.
 *
 * <p><b>Draw.</b> x₀ = L·z with L·Lᵀ = P (a Cholesky factor that tolerates the zero directions of a
 * semidefinite P) and z independent standard normal values. With x₀ drawn so, the output is
 * stationary from the first sample: its variance is the long-run variance at every time.
 */
public final class StationaryState {
    /** Doubling steps at most: 2^80 samples is beyond any pole a stable design can have in double. */
    private static final int MAX_DOUBLINGS = 80;

    private final int dim;
    private final double[][] covariance;
    private final double[][] factor;

    private StationaryState(double[][] covariance) {
        this.dim = covariance.length;
        this.covariance = covariance;
        this.factor = cholesky(covariance);
    }

    /**
     * The stationary state of a cascade.
     *
     * @param design a stable cascade (all poles inside the unit circle)
     * @throws IllegalArgumentException if the doubling does not converge (a pole on or outside the unit circle)
     */
    public static StationaryState of(SosDesign design) {
        List<Biquad> sec = design.sections();
        int n = 2 * sec.size();
        double[][] a = new double[n][n];
        double[] b = new double[n];
        // y = cy·x + dy·u, the running output of the sections so far (the input for k = 0).
        double[] cy = new double[n];
        double dy = 1;
        for (int k = 0; k < sec.size(); k++) {
            Biquad q = sec.get(k);
            int i1 = 2 * k;
            int i2 = 2 * k + 1;
            double[] cOut = new double[n];
            for (int j = 0; j < n; j++) {
                cOut[j] = q.b0() * cy[j];
            }
            cOut[i1] += 1;
            double dOut = q.b0() * dy;
            for (int j = 0; j < n; j++) {
                a[i1][j] = q.b1() * cy[j] - q.a1() * cOut[j];
                a[i2][j] = q.b2() * cy[j] - q.a2() * cOut[j];
            }
            a[i1][i2] += 1;
            b[i1] = q.b1() * dy - q.a1() * dOut;
            b[i2] = q.b2() * dy - q.a2() * dOut;
            cy = cOut;
            dy = dOut;
        }
        return new StationaryState(lyapunov(a, b));
    }

    /** Dimension of the state: two per section. */
    public int dimension() {
        return dim;
    }

    /** P[i][j], the stationary covariance of state values i and j for unit-variance white input. */
    public double covariance(int i, int j) {
        return covariance[i][j];
    }

    /**
     * Draws a state from the stationary distribution into {@code state[0..dimension())}.
     *
     * @param standardNormal independent draws of mean 0 and variance 1 (dimension() of them are taken)
     * @param inputStdDev    standard deviation of the white input the filter will run on, ≥ 0
     */
    public void draw(DoubleSupplier standardNormal, double inputStdDev, double[] state) {
        double[] z = new double[dim];
        for (int i = 0; i < dim; i++) {
            z[i] = standardNormal.getAsDouble();
        }
        for (int i = 0; i < dim; i++) {
            double s = 0;
            for (int j = 0; j <= i; j++) {
                s += factor[i][j] * z[j];
            }
            state[i] = inputStdDev * s;
        }
    }

    /** Σ Aⁱ·b·bᵀ·Aⁱᵀ by doubling. */
    private static double[][] lyapunov(double[][] a, double[] b) {
        int n = b.length;
        double[][] p = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                p[i][j] = b[i] * b[j];
            }
        }
        double[][] ak = a;
        for (int step = 0; step < MAX_DOUBLINGS; step++) {
            double[][] add = multiply(multiply(ak, p), transpose(ak));
            double change = 0;
            double size = 0;
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    p[i][j] += add[i][j];
                    change = Math.max(change, Math.abs(add[i][j]));
                    size = Math.max(size, Math.abs(p[i][j]));
                }
            }
            if (!Double.isFinite(size)) {
                break;
            }
            if (change <= 1e-17 * size) {
                symmetrize(p);
                return p;
            }
            ak = multiply(ak, ak);
        }
        throw new IllegalArgumentException("the cascade has no stationary state (a pole on or outside the unit circle)");
    }

    private static void symmetrize(double[][] p) {
        for (int i = 0; i < p.length; i++) {
            for (int j = 0; j < i; j++) {
                double m = 0.5 * (p[i][j] + p[j][i]);
                p[i][j] = m;
                p[j][i] = m;
            }
        }
    }

    /**
     * Lower Cholesky factor of a symmetric positive-semidefinite matrix: a pivot at or below
     * 1e-13 of the largest diagonal value is a direction with (numerically) no variance and gets a zero column.
     */
    private static double[][] cholesky(double[][] p) {
        int n = p.length;
        double maxDiag = 0;
        for (int i = 0; i < n; i++) {
            maxDiag = Math.max(maxDiag, p[i][i]);
        }
        double floor = 1e-13 * maxDiag;
        double[][] l = new double[n][n];
        for (int j = 0; j < n; j++) {
            double d = p[j][j];
            for (int k = 0; k < j; k++) {
                d -= l[j][k] * l[j][k];
            }
            if (d <= floor) {
                continue;
            }
            double ljj = Math.sqrt(d);
            l[j][j] = ljj;
            for (int i = j + 1; i < n; i++) {
                double s = p[i][j];
                for (int k = 0; k < j; k++) {
                    s -= l[i][k] * l[j][k];
                }
                l[i][j] = s / ljj;
            }
        }
        return l;
    }

    private static double[][] multiply(double[][] x, double[][] y) {
        int n = x.length;
        double[][] r = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int k = 0; k < n; k++) {
                double v = x[i][k];
                if (v == 0) {
                    continue;
                }
                for (int j = 0; j < n; j++) {
                    r[i][j] += v * y[k][j];
                }
            }
        }
        return r;
    }

    private static double[][] transpose(double[][] x) {
        int n = x.length;
        double[][] r = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                r[j][i] = x[i][j];
            }
        }
        return r;
    }
}
