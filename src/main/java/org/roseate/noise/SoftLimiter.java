package org.roseate.noise;

import java.util.Objects;

/**
 * A memoryless soft limiter that keeps samples below full scale: the identity up to a knee at
 * amplitude T, above it a hyperbolic-tangent shoulder that approaches full scale:
 * <pre>  y = x                                      for |x| ≤ T
 *  y = sign(x)·(T + (1 − T)·tanh((|x| − T)/(1 − T)))   for |x| &gt; T</pre>
 * Odd-symmetric and monotone. At the knee the value, the slope (1) and the curvature (0) match,
 * since tanh(0) = 0, tanh'(0) = 1 and tanh''(0) = 0. |y| &lt; 1 for every input: where tanh
 * rounds to 1 in double precision the output is held at {@code Math.nextDown(1.0)}; ±∞ map to
 * ±{@code Math.nextDown(1.0)}, NaN to NaN.
 *
 * <p>Off by default in the noise chain; it changes the spectrum only when peaks exceed the knee
 * (for Gaussian noise at −20 dBFS RMS, a −1 dBFS knee is 12.6 σ away). Immutable and
 * stateless, so {@link #process} may run on any thread.
 */
public final class SoftLimiter {

    /** Default knee, −1 dBFS (peak amplitude 10^{−1/20} ≈ 0.891). */
    public static final double DEFAULT_KNEE_DBFS = -1.0;

    private static final double BELOW_ONE = Math.nextDown(1.0);

    private final double kneeDbfs;
    private final double knee;
    private final double headroom;

    /** A limiter with its knee at {@link #DEFAULT_KNEE_DBFS}. */
    public SoftLimiter() {
        this(DEFAULT_KNEE_DBFS);
    }

    /**
     * @param kneeDbfs knee as a peak level 20·log10(T), dBFS, in [−60, −0.01]
     */
    public SoftLimiter(double kneeDbfs) {
        if (!(kneeDbfs >= -60.0 && kneeDbfs <= -0.01)) {
            throw new IllegalArgumentException("kneeDbfs=" + kneeDbfs + " must be in [-60, -0.01]");
        }
        this.kneeDbfs = kneeDbfs;
        this.knee = Math.pow(10.0, kneeDbfs / 20.0);
        this.headroom = 1.0 - knee;
    }

    public double kneeDbfs() {
        return kneeDbfs;
    }

    /** Knee amplitude T = 10^{kneeDbfs/20}, full scale. */
    public double kneeAmplitude() {
        return knee;
    }

    /** The limited value of one sample (full-scale units). */
    public double apply(double x) {
        double m = Math.abs(x);
        if (!(m > knee)) {
            return x; // also passes NaN through
        }
        double y = Math.min(knee + headroom * Math.tanh((m - knee) / headroom), BELOW_ONE);
        return x < 0 ? -y : y;
    }

    /**
     * Limits {@code buf[off] .. buf[off + n − 1]} in place. Allocates nothing; any n &gt;= 0.
     *
     * @throws IndexOutOfBoundsException if the range does not fit in {@code buf}
     */
    public void process(double[] buf, int off, int n) {
        Objects.checkFromIndexSize(off, n, buf.length);
        for (int i = off, end = off + n; i < end; i++) {
            buf[i] = apply(buf[i]);
        }
    }
}
