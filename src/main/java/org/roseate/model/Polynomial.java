package org.roseate.model;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;

/**
 * A real polynomial c0 + c1·x + … + cn·xⁿ, coefficients in ascending powers. Immutable.
 * Trailing (highest-power) zero coefficients are dropped, so {@link #degree()} is exact; the
 * zero polynomial has degree −1.
 */
public final class Polynomial {
    private final double[] c;

    public Polynomial(double... ascending) {
        int n = ascending.length;
        while (n > 0 && ascending[n - 1] == 0) {
            n--;
        }
        this.c = Arrays.copyOf(ascending, n);
    }

    public static Polynomial constant(double c0) {
        return new Polynomial(c0);
    }

    /** Coefficients, ascending powers (a copy). */
    public double[] coefficients() {
        return c.clone();
    }

    public double coefficient(int power) {
        return power < c.length ? c[power] : 0;
    }

    public int degree() {
        return c.length - 1;
    }

    public boolean isZero() {
        return c.length == 0;
    }

    public boolean isFinite() {
        for (double v : c) {
            if (!Double.isFinite(v)) {
                return false;
            }
        }
        return true;
    }

    /** Number of exactly-zero lowest coefficients: the multiplicity of the root at x = 0. */
    public int lowestPower() {
        int k = 0;
        while (k < c.length && c[k] == 0) {
            k++;
        }
        return k;
    }

    public Polynomial plus(Polynomial o) {
        double[] r = new double[Math.max(c.length, o.c.length)];
        for (int i = 0; i < r.length; i++) {
            r[i] = coefficient(i) + o.coefficient(i);
        }
        return new Polynomial(r);
    }

    public Polynomial times(Polynomial o) {
        if (isZero() || o.isZero()) {
            return new Polynomial();
        }
        double[] r = new double[c.length + o.c.length - 1];
        for (int i = 0; i < c.length; i++) {
            for (int j = 0; j < o.c.length; j++) {
                r[i + j] += c[i] * o.c[j];
            }
        }
        return new Polynomial(r);
    }

    public Polynomial times(double k) {
        double[] r = c.clone();
        for (int i = 0; i < r.length; i++) {
            r[i] *= k;
        }
        return new Polynomial(r);
    }

    /** Divides by x^k, dropping the k lowest coefficients (which the caller knows are zero). */
    public Polynomial shiftDown(int k) {
        return new Polynomial(Arrays.copyOfRange(c, Math.min(k, c.length), c.length));
    }

    /** p(x / k) for a scale k &gt; 0: coefficient i divided by kⁱ. */
    public Polynomial scaleArgument(double k) {
        double[] r = c.clone();
        double f = 1;
        for (int i = 0; i < r.length; i++) {
            r[i] /= f;
            f *= k;
        }
        return new Polynomial(r);
    }

    public double maxAbsCoefficient() {
        double m = 0;
        for (double v : c) {
            m = Math.max(m, Math.abs(v));
        }
        return m;
    }

    /** p(z) by Horner's rule. */
    public Complex evaluate(Complex z) {
        double re = 0;
        double im = 0;
        for (int i = c.length - 1; i >= 0; i--) {
            double t = re * z.re() - im * z.im() + c[i];
            im = re * z.im() + im * z.re();
            re = t;
        }
        return new Complex(re, im);
    }

    /**
     * All complex roots, conjugate pairs exact (both members listed, positive imaginary part
     * first), real roots with zero imaginary part, sorted by magnitude. Roots at x = 0 come from
     * exactly-zero low coefficients and are exact. The others: closed forms up to degree 2, else
     * the Aberth–Ehrlich simultaneous iteration (O. Aberth, "Iteration methods for finding all
     * zeros of a polynomial simultaneously", Math. Comp. 27, 1973) on the polynomial rescaled so
     * its roots have geometric-mean magnitude 1, then Newton polishing on the original.
     */
    public List<Complex> roots() {
        if (degree() < 1) {
            return List.of();
        }
        List<Complex> out = new ArrayList<>();
        int k = lowestPower();
        for (int i = 0; i < k; i++) {
            out.add(Complex.ZERO);
        }
        Polynomial p = shiftDown(k);
        int n = p.degree();
        if (n == 1) {
            out.add(Complex.real(-p.c[0] / p.c[1]));
        } else if (n == 2) {
            quadratic(p.c[2], p.c[1], p.c[0], out);
        } else if (n > 2) {
            // Rescale x = r·y with r the geometric mean of root magnitudes, so |y| ~ 1.
            double r = Math.pow(Math.abs(p.c[0] / p.c[n]), 1.0 / n);
            Polynomial q = p.scaleArgument(1 / r);
            double[] qc = q.c;
            double lead = qc[n];
            double[] monic = new double[n + 1];
            for (int i = 0; i <= n; i++) {
                monic[i] = qc[i] / lead;
            }
            Complex[] z = aberth(monic);
            for (Complex zi : z) {
                out.add(p.polish(zi.times(r)));
            }
        }
        return conjugateTidy(out);
    }

    private static void quadratic(double a, double b, double c0, List<Complex> out) {
        double disc = b * b - 4 * a * c0;
        if (disc >= 0) {
            // Numerically stable form: q = −(b + sign(b)·√disc)/2, roots q/a and c/q.
            double q = -0.5 * (b + Math.copySign(Math.sqrt(disc), b));
            out.add(Complex.real(q / a));
            out.add(Complex.real(q == 0 ? 0 : c0 / q));
        } else {
            double re = -b / (2 * a);
            double im = Math.sqrt(-disc) / (2 * Math.abs(a));
            out.add(new Complex(re, im));
            out.add(new Complex(re, -im));
        }
    }

    private static Complex[] aberth(double[] monic) {
        Polynomial p = new Polynomial(monic);
        Polynomial dp = p.derivative();
        int n = monic.length - 1;
        Complex[] z = new Complex[n];
        for (int i = 0; i < n; i++) {
            double ang = 2 * Math.PI * i / n + 0.4;
            z[i] = new Complex(Math.cos(ang), Math.sin(ang));
        }
        for (int iter = 0; iter < 500; iter++) {
            double maxStep = 0;
            for (int i = 0; i < n; i++) {
                Complex pv = p.evaluate(z[i]);
                if (pv.abs() == 0) {
                    continue;
                }
                Complex ratio = pv.dividedBy(dp.evaluate(z[i]));
                Complex sum = Complex.ZERO;
                for (int j = 0; j < n; j++) {
                    if (j != i) {
                        sum = sum.plus(z[i].minus(z[j]).reciprocal());
                    }
                }
                Complex w = ratio.dividedBy(Complex.ONE.minus(ratio.times(sum)));
                if (!w.isFinite()) {
                    w = ratio;
                }
                z[i] = z[i].minus(w);
                maxStep = Math.max(maxStep, w.abs() / Math.max(1e-300, z[i].abs()));
            }
            if (maxStep < 1e-15) {
                break;
            }
        }
        return z;
    }

    /** Up to three Newton steps on this polynomial, kept only while they reduce |p|. */
    private Complex polish(Complex z) {
        Polynomial d = derivative();
        Complex best = z;
        double bestAbs = evaluate(z).abs();
        for (int i = 0; i < 3 && bestAbs > 0; i++) {
            Complex step = evaluate(best).dividedBy(d.evaluate(best));
            Complex next = best.minus(step);
            double a = evaluate(next).abs();
            if (!(a < bestAbs)) {
                break;
            }
            best = next;
            bestAbs = a;
        }
        return best;
    }

    public Polynomial derivative() {
        if (c.length <= 1) {
            return new Polynomial();
        }
        double[] r = new double[c.length - 1];
        for (int i = 1; i < c.length; i++) {
            r[i - 1] = c[i] * i;
        }
        return new Polynomial(r);
    }

    /** Makes near-real roots real and near-conjugate pairs exact conjugates (real coefficients). */
    private static List<Complex> conjugateTidy(List<Complex> roots) {
        List<Complex> real = new ArrayList<>();
        List<Complex> upper = new ArrayList<>();
        List<Complex> lower = new ArrayList<>();
        for (Complex z : roots) {
            if (Math.abs(z.im()) <= 1e-9 * z.abs()) {
                real.add(Complex.real(z.re()));
            } else if (z.im() > 0) {
                upper.add(z);
            } else {
                lower.add(z);
            }
        }
        List<Complex> out = new ArrayList<>(real);
        // Pair each upper root with its nearest lower conjugate; unmatched ones become real.
        for (Complex u : upper) {
            int best = -1;
            double bestDist = Double.POSITIVE_INFINITY;
            for (int i = 0; i < lower.size(); i++) {
                double dist = u.minus(lower.get(i).conjugate()).abs();
                if (dist < bestDist) {
                    bestDist = dist;
                    best = i;
                }
            }
            if (best < 0) {
                out.add(Complex.real(u.re()));
                continue;
            }
            Complex l = lower.remove(best);
            double re = 0.5 * (u.re() + l.re());
            double im = 0.5 * (u.im() - l.im());
            out.add(new Complex(re, im));
            out.add(new Complex(re, -im));
        }
        for (Complex l : lower) {
            out.add(Complex.real(l.re()));
        }
        out.sort(Comparator.comparingDouble(Complex::abs).thenComparing(z -> -z.im()));
        return out;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Polynomial p && Arrays.equals(c, p.c);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(c);
    }

    @Override
    public String toString() {
        return Arrays.toString(c);
    }
}
