package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.model.Complex;

class SosDesignTest {

    static Stream<JsonNode> scipyCases() {
        // reference: scipy.signal.zpk2sos(pairing='nearest') and scipy.signal.freqz_sos, scipy 1.17.1,
        // see src/test/python/gen_digital_reference.py
        return Reference.cases("zpk2sos.json").stream();
    }

    private static DigitalZpk zpkOf(JsonNode c) {
        return new DigitalZpk(Reference.complexList(c.get("zeros")), Reference.complexList(c.get("poles")),
                c.get("gain").asDouble(), c.get("sampleRateHz").asDouble());
    }

    @ParameterizedTest
    @MethodSource("scipyCases")
    void pairingAndSectionsEqualScipyZpk2sos(JsonNode c) {
        SosDesign mine = SosDesign.fromZpk(zpkOf(c));
        SosDesign theirs = Reference.sos(c.get("sos"), c.get("sampleRateHz").asDouble());
        assertEquals(theirs.sections().size(), mine.sections().size(), "section count");
        for (int i = 0; i < mine.sections().size(); i++) {
            Biquad a = theirs.sections().get(i);
            Biquad b = mine.sections().get(i);
            double scale = Math.max(Math.max(Math.abs(a.b0()), Math.abs(a.b1())), Math.abs(a.b2()));
            String at = c.get("name").asText() + " section " + i;
            // coefficients are sums/products of two roots: 1e-13 relative covers their rounding, while a
            // different pairing or order would differ by order one
            assertEquals(a.b0(), b.b0(), scale * 1e-13, at + " b0");
            assertEquals(a.b1(), b.b1(), scale * 1e-13, at + " b1");
            assertEquals(a.b2(), b.b2(), scale * 1e-13, at + " b2");
            assertEquals(a.a1(), b.a1(), 1e-13, at + " a1");
            assertEquals(a.a2(), b.a2(), 1e-13, at + " a2");
        }
    }

    @ParameterizedTest
    @MethodSource("scipyCases")
    void responseEqualsScipyFreqzSos(JsonNode c) {
        SosDesign mine = SosDesign.fromZpk(zpkOf(c));
        double[] hz = Reference.doubles(c.get("freqHz"));
        double[] re = Reference.doubles(c.get("hRe"));
        double[] im = Reference.doubles(c.get("hIm"));
        double[] outRe = new double[hz.length];
        double[] outIm = new double[hz.length];
        mine.response(hz, outRe, outIm);
        for (int i = 0; i < hz.length; i++) {
            double mag = Math.hypot(re[i], im[i]);
            // relative 1e-10: poles near z = 1 amplify coefficient rounding by about 1/(1 − |p|) ≈ 1e3
            double tol = 1e-10 * mag;
            String at = c.get("name").asText() + " at " + hz[i] + " Hz";
            assertEquals(re[i], outRe[i], tol, at + " re");
            assertEquals(im[i], outIm[i], tol, at + " im");
            Complex single = mine.response(hz[i]);
            assertEquals(outRe[i], single.re(), 0.0, "array and single-point forms agree");
        }
    }

    @Test
    void headroomScalingKeepsTheResponseAndNormalisesTheLaterSections() {
        JsonNode c = Reference.cases("zpk2sos.json").stream()
                .filter(n -> n.get("name").asText().equals("mixed_notch_negative_gain")).findFirst().orElseThrow();
        SosDesign plain = SosDesign.fromZpk(zpkOf(c));
        SosDesign scaled = plain.withHeadroomScaling();
        double fs = plain.sampleRateHz();
        double peakResponse = 0;
        for (int i = 0; i <= 400; i++) {
            peakResponse = Math.max(peakResponse, plain.response(10 * Math.pow(0.49 * fs / 10, i / 400.0)).abs());
        }
        for (int i = 0; i <= 400; i++) {
            double hz = 10 * Math.pow(0.49 * fs / 10, i / 400.0);
            Complex a = plain.response(hz);
            Complex b = scaled.response(hz);
            // same product of coefficients up to rounding of one scale factor per section; measured against
            // the peak response because at the notch (3 kHz) the response itself is nearly zero
            assertEquals(0, a.minus(b).abs(), 1e-13 * peakResponse, "at " + hz + " Hz");
        }
        for (int s = 1; s < scaled.sections().size(); s++) {
            double peak = 0;
            Biquad q = scaled.sections().get(s);
            for (int i = 0; i <= 20000; i++) {
                peak = Math.max(peak, q.response(Math.PI * i / 20000).abs());
            }
            // the design grid is log-spaced, this check grid linear: peaks agree to well within 1 %
            assertEquals(1.0, peak, 0.01, "section " + s + " peak");
        }
        assertTrue(plain.sections().get(0).b0() != scaled.sections().get(0).b0(), "first section carries the rest");
    }

    @Test
    void orderCountsPolesAwayFromTheOrigin() {
        List<JsonNode> cases = Reference.cases("zpk2sos.json");
        // orders of the analog prototypes in gen_digital_reference.py: 2, 4, 5, 5, 3; docstring example 3
        int[] expected = {2, 4, 5, 5, 3, 3};
        for (int i = 0; i < expected.length; i++) {
            assertEquals(expected[i], SosDesign.fromZpk(zpkOf(cases.get(i))).order(), cases.get(i).get("name").asText());
        }
    }

    @Test
    void refusesAComplexRootWithoutItsConjugate() {
        DigitalZpk bad = new DigitalZpk(List.of(), List.of(new Complex(0.5, 0.3)), 1, 48000);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> SosDesign.fromZpk(bad));
        assertTrue(e.getMessage().contains("no conjugate"), e.getMessage());
    }

    @Test
    void gainOnlyBecomesOneSection() {
        SosDesign d = SosDesign.fromZpk(new DigitalZpk(List.of(), List.of(), 0.25, 48000));
        assertEquals(List.of(new Biquad(0.25, 0, 0, 0, 0)), d.sections(), "scipy returns [[k, 0, 0, 1, 0, 0]]");
    }
}
