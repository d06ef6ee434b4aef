package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * {@link SosFilter} runs its sections eight, four, then two at a time, skewed by one sample each, and applies
 * the denormal guard inside that loop. These tests hold it to the plain recursion it must equal bit for
 * bit: one sample at a time through one section after the other, transposed direct form II as
 * scipy.signal.sosfilt computes it (scipy/signal/_sosfilt.pyx; SosFilterTest checks the plain form
 * against sosfilt's own output), plus the guard as SosFilter documents it (after every 64th sample since
 * reset, state values below 1e-200 in magnitude become 0). Exact equality (tolerance 0) is the contract:
 * each section must do the same operations in the same order whatever the grouping and block split.
 */
class SosFilterPipelineTest {

    /** The plain recursion with the documented guard, sample by sample. */
    private static final class PlainCascade {
        private final List<Biquad> sections;
        private final double[] s1;
        private final double[] s2;
        private long processed;
        int guardHits;

        PlainCascade(SosDesign d) {
            sections = d.sections();
            s1 = new double[sections.size()];
            s2 = new double[sections.size()];
        }

        void setState(double[] state) {
            for (int k = 0; k < s1.length; k++) {
                s1[k] = state[2 * k];
                s2[k] = state[2 * k + 1];
            }
        }

        double step(double x) {
            double u = x;
            for (int k = 0; k < s1.length; k++) {
                Biquad q = sections.get(k);
                double y = q.b0() * u + s1[k];
                s1[k] = q.b1() * u - q.a1() * y + s2[k];
                s2[k] = q.b2() * u - q.a2() * y;
                u = y;
            }
            processed++;
            if (processed % SosFilter.FLUSH_INTERVAL == 0) {
                for (int k = 0; k < s1.length; k++) {
                    if (Math.abs(s1[k]) < SosFilter.FLUSH_BELOW) {
                        guardHits += s1[k] != 0 ? 1 : 0;
                        s1[k] = 0;
                    }
                    if (Math.abs(s2[k]) < SosFilter.FLUSH_BELOW) {
                        guardHits += s2[k] != 0 ? 1 : 0;
                        s2[k] = 0;
                    }
                }
            }
            return u;
        }
    }

    /**
     * Stable sections with random coefficients: complex or real pole pairs of radius 0.05–0.9995 (the
     * upper end is the slow poles of an 8× oversampled pink filter), zeros anywhere in |z| ≤ 1.2.
     */
    static SosDesign randomDesign(int sections, SplittableRandom r) {
        List<Biquad> list = new ArrayList<>();
        for (int k = 0; k < sections; k++) {
            double a1;
            double a2;
            if (r.nextBoolean()) {
                double radius = 0.05 + 0.9495 * r.nextDouble();
                double angle = Math.PI * r.nextDouble();
                a1 = -2 * radius * Math.cos(angle);
                a2 = radius * radius;
            } else {
                double p = -0.9995 + 1.999 * r.nextDouble();
                double q = -0.9995 + 1.999 * r.nextDouble();
                a1 = -(p + q);
                a2 = p * q;
            }
            double z1 = -1.2 + 2.4 * r.nextDouble();
            double z2 = -1.2 + 2.4 * r.nextDouble();
            double g = 0.2 + r.nextDouble();
            list.add(new Biquad(g, -g * (z1 + z2), g * z1 * z2, a1, a2));
        }
        return new SosDesign(list, 48000);
    }

    /** Block sizes for one split: mostly short and odd (tails of 0–3 samples), some long. */
    static int[] randomSplit(int total, SplittableRandom r) {
        List<Integer> sizes = new ArrayList<>();
        int left = total;
        while (left > 0) {
            int kind = r.nextInt(4);
            int n = switch (kind) {
                case 0 -> r.nextInt(4);          // 0..3: shorter than the four-section skew
                case 1 -> 4 + r.nextInt(13);     // 4..16
                case 2 -> 17 + r.nextInt(200);   // around the 64-sample guard period
                default -> 217 + r.nextInt(3000);
            };
            n = Math.min(n, left);
            sizes.add(n);
            left -= n;
        }
        return sizes.stream().mapToInt(Integer::intValue).toArray();
    }

    static double[] gaussian(int n, double scale, SplittableRandom r) {
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            // Box–Muller: only the spread matters here, not the distribution's exactness
            double u = 1 - r.nextDouble();
            x[i] = scale * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * r.nextDouble());
        }
        return x;
    }

    private static double[] plain(SosDesign d, double[] x, double[] state, PlainCascade[] keep) {
        PlainCascade p = new PlainCascade(d);
        if (state != null) {
            p.setState(state);
        }
        double[] y = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            y[i] = p.step(x[i]);
        }
        keep[0] = p;
        return y;
    }

    /** Runs {@code f} over {@code x} cut by {@code split}, alternating the in-place and two-array forms. */
    private static double[] blockwise(SosFilter f, double[] x, int[] split, SplittableRandom r) {
        double[] out = new double[x.length];
        int pos = 0;
        for (int n : split) {
            if (r.nextBoolean()) {
                // in place, at an offset inside a larger buffer
                int pad = r.nextInt(5);
                double[] buf = new double[pad + n + r.nextInt(5)];
                System.arraycopy(x, pos, buf, pad, n);
                f.process(buf, pad, n);
                System.arraycopy(buf, pad, out, pos, n);
            } else {
                double[] in = java.util.Arrays.copyOfRange(x, pos, pos + n + r.nextInt(3));
                double[] o = new double[n + r.nextInt(3)];
                f.process(in, o, n);
                System.arraycopy(o, 0, out, pos, n);
            }
            pos += n;
        }
        assertEquals(x.length, pos);
        return out;
    }

    private static void assertBitwise(double[] expected, double[] actual, String what) {
        for (int i = 0; i < expected.length; i++) {
            if (Double.doubleToRawLongBits(expected[i]) != Double.doubleToRawLongBits(actual[i])) {
                throw new AssertionError(what + ": first difference at sample " + i + ": plain "
                        + expected[i] + ", pipelined " + actual[i]);
            }
        }
    }

    @ParameterizedTest(name = "{0} sections")
    @ValueSource(ints = {1, 2, 3, 4, 5, 6, 7, 8, 9, 12, 15})
    void equalsThePlainRecursionForRandomBlockSplits(int sections) {
        SplittableRandom r = new SplittableRandom(20261202L + sections);
        for (int trial = 0; trial < 6; trial++) {
            SosDesign d = randomDesign(sections, r);
            double[] x = gaussian(3000 + r.nextInt(3000), 1.0, r);
            PlainCascade[] ref = new PlainCascade[1];
            double[] expected = plain(d, x, null, ref);
            SosFilter f = new SosFilter(d);
            assertBitwise(expected, blockwise(f, x, randomSplit(x.length, r), r),
                    sections + " sections, trial " + trial);
            // the filter's state now equals the plain recursion's: a further block continues it exactly
            double[] more = gaussian(333, 1.0, r);
            double[] moreOut = more.clone();
            f.process(moreOut, 0, moreOut.length);
            for (int i = 0; i < more.length; i++) {
                assertEquals(Double.doubleToRawLongBits(ref[0].step(more[i])),
                        Double.doubleToRawLongBits(moreOut[i]), "continuation sample " + i);
            }
        }
    }

    @ParameterizedTest(name = "{0} sections")
    @ValueSource(ints = {1, 3, 4, 5, 8, 9})
    void equalsThePlainRecursionFromASetStateAndAfterReset(int sections) {
        SplittableRandom r = new SplittableRandom(7L * sections);
        SosDesign d = randomDesign(sections, r);
        double[] state = gaussian(2 * sections, 0.3, r);
        double[] x = gaussian(2500, 1.0, r);
        PlainCascade[] ref = new PlainCascade[1];
        double[] expected = plain(d, x, state, ref);
        SosFilter f = new SosFilter(d);
        f.process(new double[100], 0, 37); // move the guard phase, then start over
        f.reset();
        f.setState(state);
        assertBitwise(expected, blockwise(f, x, randomSplit(x.length, r), r), "from a set state");
    }

    /**
     * Denormal range: noise at 1e-190 (its state falls under the 1e-200 guard level through cancellation
     * and decay), noise at 1e-305 (the input itself subnormal-adjacent), single subnormal impulses, and
     * silence after a burst so the state decays through the guard level. The guard must fire at the same
     * samples as in the plain recursion; the test checks that it did fire, so a pipelined guard at the
     * wrong sample would be caught.
     */
    @ParameterizedTest(name = "{0} sections")
    @ValueSource(ints = {1, 2, 3, 4, 5, 7, 8, 9, 15})
    void guardFiresAtTheSameSamplesInTheDenormalRange(int sections) {
        SplittableRandom r = new SplittableRandom(99L + sections);
        int totalHits = 0;
        for (int trial = 0; trial < 4; trial++) {
            SosDesign d = randomDesign(sections, r);
            int n = 6000;
            double[] x = new double[n];
            double[] burst = gaussian(n, 1.0, r);
            for (int i = 0; i < n; i++) {
                int part = i / 1000;
                x[i] = switch (part) {
                    case 0 -> burst[i];                        // normal level
                    case 1 -> 0;                               // silence: decay towards the guard level
                    case 2 -> burst[i] * 1e-190;
                    case 3 -> burst[i] * 1e-305;
                    case 4 -> (i % 97 == 0) ? Double.MIN_VALUE * (1 + r.nextInt(1000)) : 0;
                    default -> 0;
                };
            }
            PlainCascade[] ref = new PlainCascade[1];
            double[] expected = plain(d, x, null, ref);
            totalHits += ref[0].guardHits;
            SosFilter f = new SosFilter(d);
            assertBitwise(expected, blockwise(f, x, randomSplit(n, r), r), sections + " sections, trial " + trial);
            double[] whole = x.clone();
            new SosFilter(d).process(whole, whole, n);
            assertBitwise(expected, whole, "whole signal in one call");
        }
        assertTrue(totalHits > 0, "the inputs must make the guard fire, else this test proves nothing");
    }

    @ParameterizedTest(name = "{0} sections")
    @ValueSource(ints = {4, 8})
    void shortBlocksAtEveryGuardPhase(int sections) {
        // every block length 0..9 starting at every phase of the 64-sample guard period
        SplittableRandom r = new SplittableRandom(5L);
        SosDesign d = randomDesign(sections, r);
        for (int len = 0; len < 10; len++) {
            for (int lead = 0; lead < SosFilter.FLUSH_INTERVAL; lead++) {
                double[] x = gaussian(lead + len + 70, 1e-195, r);
                PlainCascade[] ref = new PlainCascade[1];
                double[] expected = plain(d, x, null, ref);
                SosFilter f = new SosFilter(d);
                double[] out = blockwise(f, x, new int[] {lead, len, x.length - lead - len}, r);
                assertBitwise(expected, out, "len " + len + " after " + lead);
            }
        }
    }
}
