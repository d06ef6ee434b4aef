package org.roseate.digital;

import java.util.List;

/**
 * Running state of a {@link SosDesign}: each section in transposed direct form II, in double
 * (recursion in package-info, the same as scipy.signal.sosfilt). One thread at a time.
 *
 * <p>{@code process} allocates nothing and works for any n ≥ 0; processing a signal in blocks of any
 * sizes gives bitwise the same output as processing it whole.
 *
 * <p>Denormal guard: every {@value #FLUSH_INTERVAL} samples, counted from construction or
 * {@link #reset()} and therefore independent of how the signal is cut into blocks, each state value with
 * magnitude below {@value #FLUSH_BELOW} is set to exactly 0. After exact-silence input the state thus
 * reaches exact zero instead of decaying through the subnormal range (where arithmetic is slow on many
 * CPUs). The change is below 1e-200 relative to full scale, far under any audible or measurable level.
 */
public final class SosFilter {
    /** Samples between two denormal flushes. */
    public static final int FLUSH_INTERVAL = 64;
    /** State magnitudes below this are flushed to zero. */
    public static final double FLUSH_BELOW = 1e-200;

    private final int n;
    private final double[] b0;
    private final double[] b1;
    private final double[] b2;
    private final double[] a1;
    private final double[] a2;
    private final double[] s1;
    private final double[] s2;
    private int untilFlush = FLUSH_INTERVAL;

    /** A filter with zero state running {@code design}. */
    public SosFilter(SosDesign design) {
        List<Biquad> sec = design.sections();
        n = sec.size();
        b0 = new double[n];
        b1 = new double[n];
        b2 = new double[n];
        a1 = new double[n];
        a2 = new double[n];
        s1 = new double[n];
        s2 = new double[n];
        for (int i = 0; i < n; i++) {
            Biquad q = sec.get(i);
            b0[i] = q.b0();
            b1[i] = q.b1();
            b2[i] = q.b2();
            a1[i] = q.a1();
            a2[i] = q.a2();
        }
    }

    /**
     * Filters {@code in[0..n)} into {@code out[0..n)}; {@code in == out} is allowed.
     *
     * @param n number of samples, 0 ≤ n ≤ min(in.length, out.length)
     */
    public void process(double[] in, double[] out, int n) {
        if (n < 0 || n > in.length || n > out.length) {
            throw new IllegalArgumentException("n=" + n + " must be in [0, " + Math.min(in.length, out.length) + "]");
        }
        if (in != out) {
            System.arraycopy(in, 0, out, 0, n);
        }
        run(out, 0, n);
    }

    /**
     * Filters {@code buf[offset..offset+n)} in place.
     *
     * @param offset first sample, ≥ 0
     * @param n      number of samples, ≥ 0, offset + n ≤ buf.length
     */
    public void process(double[] buf, int offset, int n) {
        if (offset < 0 || n < 0 || offset > buf.length - n) {
            throw new IllegalArgumentException("offset=" + offset + ", n=" + n + " outside buffer of length "
                    + buf.length);
        }
        run(buf, offset, n);
    }

    /**
     * Sets the state, e.g. a draw from {@link StationaryState}, in the order [s1₀, s2₀, s1₁, s2₁, …].
     *
     * @param state at least 2·sections values
     */
    public void setState(double[] state) {
        if (state.length < 2 * n) {
            throw new IllegalArgumentException("state has " + state.length + " values; need " + 2 * n);
        }
        for (int k = 0; k < n; k++) {
            s1[k] = state[2 * k];
            s2[k] = state[2 * k + 1];
        }
    }

    /** Clears all state, as after construction. */
    public void reset() {
        java.util.Arrays.fill(s1, 0);
        java.util.Arrays.fill(s2, 0);
        untilFlush = FLUSH_INTERVAL;
    }

    private void run(double[] buf, int offset, int count) {
        int done = 0;
        while (done < count) {
            int seg = Math.min(count - done, untilFlush);
            runSections(buf, offset + done, seg);
            done += seg;
            untilFlush -= seg;
            if (untilFlush == 0) {
                flushTinyState();
                untilFlush = FLUSH_INTERVAL;
            }
        }
    }

    /**
     * Runs the sections two at a time, the second one sample behind the first, so the two
     * recursions (each bound by its multiply-add latency) overlap in the CPU. Every section does the
     * same arithmetic in the same order as one section at a time, so the output is bitwise the same.
     */
    private void runSections(double[] buf, int from, int count) {
        if (count == 0) {
            return;
        }
        int end = from + count;
        int k = 0;
        for (; k + 1 < n; k += 2) {
            double c0 = b0[k];
            double c1 = b1[k];
            double c2 = b2[k];
            double d1 = a1[k];
            double d2 = a2[k];
            double z1 = s1[k];
            double z2 = s2[k];
            double e0 = b0[k + 1];
            double e1 = b1[k + 1];
            double e2 = b2[k + 1];
            double f1 = a1[k + 1];
            double f2 = a2[k + 1];
            double w1 = s1[k + 1];
            double w2 = s2[k + 1];
            double x = buf[from];
            double prev = c0 * x + z1;
            z1 = c1 * x - d1 * prev + z2;
            z2 = c2 * x - d2 * prev;
            for (int i = from + 1; i < end; i++) {
                double xa = buf[i];
                double ya = c0 * xa + z1;
                z1 = c1 * xa - d1 * ya + z2;
                z2 = c2 * xa - d2 * ya;
                double yb = e0 * prev + w1;
                w1 = e1 * prev - f1 * yb + w2;
                w2 = e2 * prev - f2 * yb;
                buf[i - 1] = yb;
                prev = ya;
            }
            double yb = e0 * prev + w1;
            w1 = e1 * prev - f1 * yb + w2;
            w2 = e2 * prev - f2 * yb;
            buf[end - 1] = yb;
            s1[k] = z1;
            s2[k] = z2;
            s1[k + 1] = w1;
            s2[k + 1] = w2;
        }
        if (k < n) {
            double c0 = b0[k];
            double c1 = b1[k];
            double c2 = b2[k];
            double d1 = a1[k];
            double d2 = a2[k];
            double z1 = s1[k];
            double z2 = s2[k];
            for (int i = from; i < end; i++) {
                double x = buf[i];
                double y = c0 * x + z1;
                z1 = c1 * x - d1 * y + z2;
                z2 = c2 * x - d2 * y;
                buf[i] = y;
            }
            s1[k] = z1;
            s2[k] = z2;
        }
    }

    private void flushTinyState() {
        for (int k = 0; k < n; k++) {
            if (Math.abs(s1[k]) < FLUSH_BELOW) {
                s1[k] = 0;
            }
            if (Math.abs(s2[k]) < FLUSH_BELOW) {
                s2[k] = 0;
            }
        }
    }
}
