package org.roseate.digital;

import java.util.List;

/**
 * Running state of a {@link SosDesign}: each section in transposed direct form II, in double
 * (recursion in package-info, the same as scipy.signal.sosfilt). One thread at a time.
 *
 * <p>{@code process} allocates nothing and works for any n ≥ 0; processing a signal in blocks of any
 * sizes gives bitwise the same output as processing it whole.
 *
 * <p>Denormal guard: right after each section has processed its 64th, 128th, … sample (counted from
 * construction or {@link #reset()} and therefore independent of how the signal is cut into blocks), each
 * of that section's two state values with magnitude below {@value #FLUSH_BELOW} is set to exactly 0.
 * After exact-silence input the state thus reaches exact zero instead of decaying through the subnormal
 * range (where arithmetic is slow on many CPUs). The change is below 1e-200 relative to full scale, far
 * under any audible or measurable level.
 *
 * <p>Speed: the sections run in groups of eight (then four, two and one for the rest), section j of a
 * group {@code j} samples behind the first, so up to eight recursions (each bound by the latency of its
 * multiply–add chain) are in flight together;
 * the guard is applied inside that loop, to each section at its own point, so the loop is never cut.
 * Every section still does the same operations in the same order on the same values as the plain
 * one-section-at-a-time recursion, so the output is bitwise that recursion's ({@code SosFilterPipelineTest}).
 */
public final class SosFilter {
    /** Samples between two denormal flushes (a power of two). */
    public static final int FLUSH_INTERVAL = 64;
    private static final int PHASE_MASK = FLUSH_INTERVAL - 1;
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
    /** Samples processed since construction or reset, modulo {@link #FLUSH_INTERVAL}. */
    private int phase;

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
        phase = 0;
    }

    private void run(double[] buf, int from, int count) {
        if (count == 0) {
            return;
        }
        int k = 0;
        for (; k + 7 < n; k += 8) {
            runEight(k, buf, from, count);
        }
        if (k + 3 < n) {
            runFour(k, buf, from, count);
            k += 4;
        }
        if (k + 1 < n) {
            runTwo(k, buf, from, count);
            k += 2;
        }
        if (k < n) {
            runOne(k, buf, from, from + count, phase);
        }
        phase = (int) ((phase + (long) count) & PHASE_MASK);
    }

    /** {@code v}, or exactly 0 if |v| &lt; {@link #FLUSH_BELOW} (the denormal guard). */
    private static double guarded(double v) {
        return Math.abs(v) < FLUSH_BELOW ? 0.0 : v;
    }

    /**
     * Section {@code k} alone over {@code buf[lo..hi)} in place; {@code before} is the number of samples
     * this section had processed before {@code buf[lo]}, modulo {@link #FLUSH_INTERVAL}.
     */
    private void runOne(int k, double[] buf, int lo, int hi, int before) {
        double c0 = b0[k];
        double c1 = b1[k];
        double c2 = b2[k];
        double d1 = a1[k];
        double d2 = a2[k];
        double z1 = s1[k];
        double z2 = s2[k];
        int ph = before;
        for (int i = lo; i < hi; i++) {
            double x = buf[i];
            double y = c0 * x + z1;
            z1 = c1 * x - d1 * y + z2;
            z2 = c2 * x - d2 * y;
            buf[i] = y;
            ph = (ph + 1) & PHASE_MASK;
            if (ph == 0) {
                z1 = guarded(z1);
                z2 = guarded(z2);
            }
        }
        s1[k] = z1;
        s2[k] = z2;
    }

    /**
     * Sections k and k+1 over {@code buf[from..from+count)}, the second one sample behind the first
     * (two recursions in flight).
     */
    private void runTwo(int k, double[] buf, int from, int count) {
        int end = from + count;
        if (count < 2) {
            runOne(k, buf, from, end, phase);
            runOne(k + 1, buf, from, end, phase);
            return;
        }
        runOne(k, buf, from, from + 1, phase);
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
        double prev = buf[from];
        // ph: samples the first section has processed (mod FLUSH_INTERVAL); the second is one behind
        int ph = (phase + 1) & PHASE_MASK;
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
            ph = (ph + 1) & PHASE_MASK;
            if (ph < 2) {
                if (ph == 0) {
                    z1 = guarded(z1);
                    z2 = guarded(z2);
                } else {
                    w1 = guarded(w1);
                    w2 = guarded(w2);
                }
            }
        }
        s1[k] = z1;
        s2[k] = z2;
        s1[k + 1] = w1;
        s2[k + 1] = w2;
        buf[end - 1] = prev;
        runOne(k + 1, buf, end - 1, end, (phase + count - 1) & PHASE_MASK);
    }

    /**
     * Sections k..k+7 over {@code buf[from..from+count)}, section k+j running j samples behind section k
     * (eight recursions in flight; as {@link #runFour}, which documents the scheme).
     */
    private void runEight(int k, double[] buf, int from, int count) {
        int end = from + count;
        if (count < 8) {
            for (int j = 0; j < 8; j++) {
                runOne(k + j, buf, from, end, phase);
            }
            return;
        }
        runOne(k + 0, buf, from, from + 7, phase);
        runOne(k + 1, buf, from, from + 6, phase);
        runOne(k + 2, buf, from, from + 5, phase);
        runOne(k + 3, buf, from, from + 4, phase);
        runOne(k + 4, buf, from, from + 3, phase);
        runOne(k + 5, buf, from, from + 2, phase);
        runOne(k + 6, buf, from, from + 1, phase);
        double b0_0 = b0[k + 0];
        double b1_0 = b1[k + 0];
        double b2_0 = b2[k + 0];
        double d1_0 = a1[k + 0];
        double d2_0 = a2[k + 0];
        double z1_0 = s1[k + 0];
        double z2_0 = s2[k + 0];
        double b0_1 = b0[k + 1];
        double b1_1 = b1[k + 1];
        double b2_1 = b2[k + 1];
        double d1_1 = a1[k + 1];
        double d2_1 = a2[k + 1];
        double z1_1 = s1[k + 1];
        double z2_1 = s2[k + 1];
        double b0_2 = b0[k + 2];
        double b1_2 = b1[k + 2];
        double b2_2 = b2[k + 2];
        double d1_2 = a1[k + 2];
        double d2_2 = a2[k + 2];
        double z1_2 = s1[k + 2];
        double z2_2 = s2[k + 2];
        double b0_3 = b0[k + 3];
        double b1_3 = b1[k + 3];
        double b2_3 = b2[k + 3];
        double d1_3 = a1[k + 3];
        double d2_3 = a2[k + 3];
        double z1_3 = s1[k + 3];
        double z2_3 = s2[k + 3];
        double b0_4 = b0[k + 4];
        double b1_4 = b1[k + 4];
        double b2_4 = b2[k + 4];
        double d1_4 = a1[k + 4];
        double d2_4 = a2[k + 4];
        double z1_4 = s1[k + 4];
        double z2_4 = s2[k + 4];
        double b0_5 = b0[k + 5];
        double b1_5 = b1[k + 5];
        double b2_5 = b2[k + 5];
        double d1_5 = a1[k + 5];
        double d2_5 = a2[k + 5];
        double z1_5 = s1[k + 5];
        double z2_5 = s2[k + 5];
        double b0_6 = b0[k + 6];
        double b1_6 = b1[k + 6];
        double b2_6 = b2[k + 6];
        double d1_6 = a1[k + 6];
        double d2_6 = a2[k + 6];
        double z1_6 = s1[k + 6];
        double z2_6 = s2[k + 6];
        double b0_7 = b0[k + 7];
        double b1_7 = b1[k + 7];
        double b2_7 = b2[k + 7];
        double d1_7 = a1[k + 7];
        double d2_7 = a2[k + 7];
        double z1_7 = s1[k + 7];
        double z2_7 = s2[k + 7];
        double p0 = buf[from + 6];
        double p1 = buf[from + 5];
        double p2 = buf[from + 4];
        double p3 = buf[from + 3];
        double p4 = buf[from + 2];
        double p5 = buf[from + 1];
        double p6 = buf[from + 0];
        int ph = (phase + 7) & PHASE_MASK;
        int i = from + 7;
        while (i < end) {
            int next = (ph + 1) & PHASE_MASK;
            int toGuard = next < 8 ? 1 : FLUSH_INTERVAL - next + 1;
            int stop = end - i > toGuard ? i + toGuard : end;
            boolean guardDue = stop - i == toGuard;
            for (; i < stop; i++) {
                double x = buf[i];
                double y0 = b0_0 * x + z1_0;
                z1_0 = b1_0 * x - d1_0 * y0 + z2_0;
                z2_0 = b2_0 * x - d2_0 * y0;
                double y1 = b0_1 * p0 + z1_1;
                z1_1 = b1_1 * p0 - d1_1 * y1 + z2_1;
                z2_1 = b2_1 * p0 - d2_1 * y1;
                double y2 = b0_2 * p1 + z1_2;
                z1_2 = b1_2 * p1 - d1_2 * y2 + z2_2;
                z2_2 = b2_2 * p1 - d2_2 * y2;
                double y3 = b0_3 * p2 + z1_3;
                z1_3 = b1_3 * p2 - d1_3 * y3 + z2_3;
                z2_3 = b2_3 * p2 - d2_3 * y3;
                double y4 = b0_4 * p3 + z1_4;
                z1_4 = b1_4 * p3 - d1_4 * y4 + z2_4;
                z2_4 = b2_4 * p3 - d2_4 * y4;
                double y5 = b0_5 * p4 + z1_5;
                z1_5 = b1_5 * p4 - d1_5 * y5 + z2_5;
                z2_5 = b2_5 * p4 - d2_5 * y5;
                double y6 = b0_6 * p5 + z1_6;
                z1_6 = b1_6 * p5 - d1_6 * y6 + z2_6;
                z2_6 = b2_6 * p5 - d2_6 * y6;
                double y7 = b0_7 * p6 + z1_7;
                z1_7 = b1_7 * p6 - d1_7 * y7 + z2_7;
                z2_7 = b2_7 * p6 - d2_7 * y7;
                buf[i - 7] = y7;
                p6 = y6;
                p5 = y5;
                p4 = y4;
                p3 = y3;
                p2 = y2;
                p1 = y1;
                p0 = y0;
            }
            if (!guardDue) {
                break;
            }
            ph = (ph + toGuard) & PHASE_MASK;
            switch (ph) {
                case 0 -> {
                    z1_0 = guarded(z1_0);
                    z2_0 = guarded(z2_0);
                }
                case 1 -> {
                    z1_1 = guarded(z1_1);
                    z2_1 = guarded(z2_1);
                }
                case 2 -> {
                    z1_2 = guarded(z1_2);
                    z2_2 = guarded(z2_2);
                }
                case 3 -> {
                    z1_3 = guarded(z1_3);
                    z2_3 = guarded(z2_3);
                }
                case 4 -> {
                    z1_4 = guarded(z1_4);
                    z2_4 = guarded(z2_4);
                }
                case 5 -> {
                    z1_5 = guarded(z1_5);
                    z2_5 = guarded(z2_5);
                }
                case 6 -> {
                    z1_6 = guarded(z1_6);
                    z2_6 = guarded(z2_6);
                }
                case 7 -> {
                    z1_7 = guarded(z1_7);
                    z2_7 = guarded(z2_7);
                }
                default -> throw new IllegalStateException("guard phase " + ph);
            }
        }
        s1[k + 0] = z1_0;
        s2[k + 0] = z2_0;
        s1[k + 1] = z1_1;
        s2[k + 1] = z2_1;
        s1[k + 2] = z1_2;
        s2[k + 2] = z2_2;
        s1[k + 3] = z1_3;
        s2[k + 3] = z2_3;
        s1[k + 4] = z1_4;
        s2[k + 4] = z2_4;
        s1[k + 5] = z1_5;
        s2[k + 5] = z2_5;
        s1[k + 6] = z1_6;
        s2[k + 6] = z2_6;
        s1[k + 7] = z1_7;
        s2[k + 7] = z2_7;
        buf[end - 1] = p0;
        buf[end - 2] = p1;
        buf[end - 3] = p2;
        buf[end - 4] = p3;
        buf[end - 5] = p4;
        buf[end - 6] = p5;
        buf[end - 7] = p6;
        runOne(k + 1, buf, end - 1, end, (phase + count - 1) & PHASE_MASK);
        runOne(k + 2, buf, end - 2, end, (phase + count - 2) & PHASE_MASK);
        runOne(k + 3, buf, end - 3, end, (phase + count - 3) & PHASE_MASK);
        runOne(k + 4, buf, end - 4, end, (phase + count - 4) & PHASE_MASK);
        runOne(k + 5, buf, end - 5, end, (phase + count - 5) & PHASE_MASK);
        runOne(k + 6, buf, end - 6, end, (phase + count - 6) & PHASE_MASK);
        runOne(k + 7, buf, end - 7, end, (phase + count - 7) & PHASE_MASK);
    }

    /**
     * Sections k..k+3 over {@code buf[from..from+count)}, section k+j running j samples behind section k
     * (four recursions in flight). A short prologue and epilogue run the sections one at a time.
     */
    private void runFour(int k, double[] buf, int from, int count) {
        int end = from + count;
        if (count < 4) {
            for (int j = 0; j < 4; j++) {
                runOne(k + j, buf, from, end, phase);
            }
            return;
        }
        // prologue: section k on samples 0..2, k+1 on 0..1, k+2 on 0 (of this block)
        runOne(k, buf, from, from + 3, phase);
        runOne(k + 1, buf, from, from + 2, phase);
        runOne(k + 2, buf, from, from + 1, phase);
        double a0 = b0[k];
        double a1c = b1[k];
        double a2c = b2[k];
        double ad1 = a1[k];
        double ad2 = a2[k];
        double az1 = s1[k];
        double az2 = s2[k];
        double b0c = b0[k + 1];
        double b1c = b1[k + 1];
        double b2c = b2[k + 1];
        double bd1 = a1[k + 1];
        double bd2 = a2[k + 1];
        double bz1 = s1[k + 1];
        double bz2 = s2[k + 1];
        double c0 = b0[k + 2];
        double c1 = b1[k + 2];
        double c2 = b2[k + 2];
        double cd1 = a1[k + 2];
        double cd2 = a2[k + 2];
        double cz1 = s1[k + 2];
        double cz2 = s2[k + 2];
        double e0 = b0[k + 3];
        double e1 = b1[k + 3];
        double e2 = b2[k + 3];
        double ed1 = a1[k + 3];
        double ed2 = a2[k + 3];
        double ez1 = s1[k + 3];
        double ez2 = s2[k + 3];
        double pa = buf[from + 2]; // section k's output at i-1
        double pb = buf[from + 1]; // section k+1's output at i-2
        double pc = buf[from];     // section k+2's output at i-3
        // ph: samples section k has processed (mod FLUSH_INTERVAL); section k+j is j behind, so after the
        // iteration that brings ph to j (j = 0..3) section k+j has just completed a guard period. The inner
        // loop runs uncut up to the next such iteration.
        int ph = (phase + 3) & PHASE_MASK;
        int i = from + 3;
        while (i < end) {
            int next = (ph + 1) & PHASE_MASK;
            int toGuard = next < 4 ? 1 : FLUSH_INTERVAL - next + 1;
            int stop = end - i > toGuard ? i + toGuard : end;
            boolean guardDue = stop - i == toGuard;
            for (; i < stop; i++) {
                double x = buf[i];
                double ya = a0 * x + az1;
                az1 = a1c * x - ad1 * ya + az2;
                az2 = a2c * x - ad2 * ya;
                double yb = b0c * pa + bz1;
                bz1 = b1c * pa - bd1 * yb + bz2;
                bz2 = b2c * pa - bd2 * yb;
                double yc = c0 * pb + cz1;
                cz1 = c1 * pb - cd1 * yc + cz2;
                cz2 = c2 * pb - cd2 * yc;
                double ye = e0 * pc + ez1;
                ez1 = e1 * pc - ed1 * ye + ez2;
                ez2 = e2 * pc - ed2 * ye;
                buf[i - 3] = ye;
                pc = yc;
                pb = yb;
                pa = ya;
            }
            if (!guardDue) {
                break;
            }
            ph = (ph + toGuard) & PHASE_MASK;
            if (ph == 0) {
                az1 = guarded(az1);
                az2 = guarded(az2);
            } else if (ph == 1) {
                bz1 = guarded(bz1);
                bz2 = guarded(bz2);
            } else if (ph == 2) {
                cz1 = guarded(cz1);
                cz2 = guarded(cz2);
            } else {
                ez1 = guarded(ez1);
                ez2 = guarded(ez2);
            }
        }
        s1[k] = az1;
        s2[k] = az2;
        s1[k + 1] = bz1;
        s2[k + 1] = bz2;
        s1[k + 2] = cz1;
        s2[k + 2] = cz2;
        s1[k + 3] = ez1;
        s2[k + 3] = ez2;
        // epilogue: the outputs still in flight, then the lagging sections finish the block
        buf[end - 1] = pa;
        buf[end - 2] = pb;
        buf[end - 3] = pc;
        runOne(k + 1, buf, end - 1, end, (phase + count - 1) & PHASE_MASK);
        runOne(k + 2, buf, end - 2, end, (phase + count - 2) & PHASE_MASK);
        runOne(k + 3, buf, end - 3, end, (phase + count - 3) & PHASE_MASK);
    }
}
