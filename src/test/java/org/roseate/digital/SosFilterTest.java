package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.List;
import java.util.Random;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.model.Complex;
import org.roseate.model.Zpk;

class SosFilterTest {

    static Stream<JsonNode> scipyCases() {
        // reference: scipy.signal.sosfilt 1.17.1 on seeded noise (numpy default_rng(20261201)),
        // see src/test/python/gen_digital_reference.py
        return Reference.cases("sosfilt.json").stream();
    }

    private static double maxAbs(double[] x) {
        double m = 0;
        for (double v : x) {
            m = Math.max(m, Math.abs(v));
        }
        return m;
    }

    @ParameterizedTest
    @MethodSource("scipyCases")
    void scipySectionsFilterLikeSosfilt(JsonNode c) {
        SosDesign design = Reference.sos(c.get("sos"), c.get("sampleRateHz").asDouble());
        double[] x = Reference.doubles(c.get("input"));
        double[] expected = Reference.doubles(c.get("output"));
        double[] y = new double[x.length];
        new SosFilter(design).process(x, y, x.length);
        double scale = maxAbs(expected);
        for (int i = 0; i < y.length; i++) {
            // same recursion as sosfilt: only the rounding of the JSON round trip remains; 1e-12 relative
            assertEquals(expected[i], y[i], 1e-12 * scale, "sample " + i);
        }
    }

    @ParameterizedTest
    @MethodSource("scipyCases")
    void ownPairingFiltersLikeSosfilt(JsonNode c) {
        String name = c.get("name").asText();
        JsonNode zc = Reference.cases("zpk2sos.json").stream()
                .filter(n -> n.get("name").asText().equals(name)).findFirst().orElseThrow();
        DigitalZpk zpk = new DigitalZpk(Reference.complexList(zc.get("zeros")), Reference.complexList(zc.get("poles")),
                zc.get("gain").asDouble(), zc.get("sampleRateHz").asDouble());
        double[] x = Reference.doubles(c.get("input"));
        double[] expected = Reference.doubles(c.get("output"));
        double[] y = x.clone();
        new SosFilter(SosDesign.fromZpk(zpk)).process(y, y, y.length);
        double scale = maxAbs(expected);
        for (int i = 0; i < y.length; i++) {
            // coefficients agree with scipy's to ~1e-16; poles near z = 1 (|1 − p| ≈ 1.4e-3) amplify that
            // to ~1e-13 of full scale, inside the 1e-12 relative target
            assertEquals(expected[i], y[i], 1e-12 * scale, name + " sample " + i);
        }
    }

    static SosDesign pinkDesign() {
        Zpk pink = OversamplingTest.pinkNetwork();
        return SosDesign.fromZpk(Bilinear.discretize(pink, 44100, 1000)).withHeadroomScaling();
    }

    static double[] noise(int n, long seed) {
        Random r = new Random(seed);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = r.nextGaussian();
        }
        return x;
    }

    @Test
    void blocksOfAnySizeGiveTheWholeSignalBitwise() {
        SosDesign d = pinkDesign();
        double[] x = noise(5003, 7);
        double[] whole = new double[x.length];
        new SosFilter(d).process(x, whole, x.length);
        for (int block : new int[] {1, 3, 64, 1000}) {
            SosFilter f = new SosFilter(d);
            double[] buf = x.clone();
            for (int off = 0; off < buf.length; off += block) {
                f.process(buf, off, Math.min(block, buf.length - off));
            }
            assertArrayEquals(whole, buf, 0.0, "block " + block);
        }
        // irregular blocks, including empty ones, through the two-array form
        SosFilter f = new SosFilter(d);
        double[] out = new double[x.length];
        double[] tmpIn = new double[200];
        double[] tmpOut = new double[200];
        int[] sizes = {0, 1, 2, 0, 7, 199, 13, 64};
        int pos = 0;
        for (int i = 0; pos < x.length; i++) {
            int n = Math.min(sizes[i % sizes.length], x.length - pos);
            System.arraycopy(x, pos, tmpIn, 0, n);
            f.process(tmpIn, tmpOut, n);
            System.arraycopy(tmpOut, 0, out, pos, n);
            pos += n;
        }
        assertArrayEquals(whole, out, 0.0);
    }

    @Test
    void resetStartsOverAndInPlaceEqualsTwoArrays() {
        SosDesign d = pinkDesign();
        double[] x = noise(777, 11);
        SosFilter f = new SosFilter(d);
        double[] first = new double[x.length];
        f.process(x, first, x.length);
        f.reset();
        double[] again = x.clone();
        f.process(again, again, again.length);
        assertArrayEquals(first, again, 0.0);
        assertTrue(x[10] != again[10], "input array untouched by the two-array form");
    }

    @Test
    void rejectsCountsOutsideTheBuffers() {
        SosFilter f = new SosFilter(pinkDesign());
        double[] b = new double[4];
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> f.process(b, b, 5));
        assertTrue(e.getMessage().contains("n=5"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> f.process(b, 3, 2));
        assertThrows(IllegalArgumentException.class, () -> f.process(b, b, -1));
    }

    @Test
    void stateNeverSitsInTheSubnormalRangeAfterSilence() {
        // fast poles (|p| ≈ 0.1) decay into the subnormal range within a few hundred samples of silence
        SosDesign d = new SosDesign(List.of(new Biquad(1, 0, 0, -0.2, 0.01), new Biquad(1, 0.5, 0, -0.1, 0)), 48000);
        double[] x = new double[20000];
        System.arraycopy(noise(100, 3), 0, x, 0, 100);
        double[] y = x.clone();
        new SosFilter(d).process(y, y, y.length);
        int subnormal = 0;
        for (double v : y) {
            if (v != 0 && Math.abs(v) < Double.MIN_NORMAL) {
                subnormal++;
            }
        }
        assertEquals(0, subnormal, "subnormal output samples");
        assertEquals(0.0, y[y.length - 1], 0.0, "silence in gives exact zero out");
        // the same recursion without the guard does go subnormal: the check above can fail
        assertTrue(countSubnormalWithoutGuard(d, x) > 0);
    }

    private static int countSubnormalWithoutGuard(SosDesign d, double[] x) {
        int count = 0;
        double[] s1 = new double[d.sections().size()];
        double[] s2 = new double[d.sections().size()];
        for (double v : x) {
            double u = v;
            for (int k = 0; k < s1.length; k++) {
                Biquad q = d.sections().get(k);
                double y = q.b0() * u + s1[k];
                s1[k] = q.b1() * u - q.a1() * y + s2[k];
                s2[k] = q.b2() * u - q.a2() * y;
                u = y;
            }
            if (u != 0 && Math.abs(u) < Double.MIN_NORMAL) {
                count++;
            }
        }
        return count;
    }

    @Test
    void steadySineComesOutScaledByTheDesignResponse() {
        SosDesign d = pinkDesign();
        double fs = d.sampleRateHz();
        double hz = 1234.5;
        int n = 60000;
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = Math.sin(2 * Math.PI * hz * i / fs);
        }
        new SosFilter(d).process(x, x, n);
        Complex h = d.response(hz);
        // compare the last cycles (the 10 Hz pole's transient has decayed by e^-(n·2π·10/fs) ≈ 1e-37)
        for (int i = n - 200; i < n; i++) {
            double w = 2 * Math.PI * hz * i / fs;
            double expected = h.re() * Math.sin(w) + h.im() * Math.cos(w);
            // tolerance: phase rounding of w at i ≈ 6e4 and filter rounding, far below 1e-9
            assertEquals(expected, x[i], 1e-9, "sample " + i);
        }
    }
}
