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
import org.junit.jupiter.params.provider.ValueSource;
import org.roseate.digital.UnrenderableModelException.Reason;
import org.roseate.model.Complex;
import org.roseate.model.Zpk;

class BilinearTest {
    private static final double TWO_PI = 2 * Math.PI;

    static Stream<JsonNode> scipyCases() {
        // reference: scipy.signal.bilinear_zpk 1.17.1, see src/test/python/gen_digital_reference.py
        return Reference.cases("bilinear_none.json").stream();
    }

    @ParameterizedTest
    @MethodSource("scipyCases")
    void plainBilinearEqualsScipyBilinearZpk(JsonNode c) {
        JsonNode a = c.get("analog");
        Zpk analog = new Zpk(Reference.complexList(a.get("zeros")), Reference.complexList(a.get("poles")),
                a.get("gain").asDouble());
        double fs = c.get("sampleRateHz").asDouble();
        DigitalZpk d = Bilinear.discretize(analog, fs, PrewarpRule.NONE, 1000);
        JsonNode e = c.get("digital");
        // z-plane roots have magnitude <= 1: a few ulp from a different complex-division rounding order
        assertRoots(Reference.complexList(e.get("zeros")), d.zeros(), 1e-14, c.get("name").asText() + " zeros");
        assertRoots(Reference.complexList(e.get("poles")), d.poles(), 1e-14, c.get("name").asText() + " poles");
        double k = e.get("gain").asDouble();
        // gain is a ratio of products of up to 5 factors: relative 1e-13 covers their rounding
        assertEquals(k, d.gain(), Math.abs(k) * 1e-13, c.get("name").asText() + " gain");
        assertEquals(fs, d.sampleRateHz());
    }

    private static void assertRoots(List<Complex> expected, List<Complex> actual, double tol, String what) {
        assertEquals(expected.size(), actual.size(), what + " count");
        for (int i = 0; i < expected.size(); i++) {
            assertEquals(expected.get(i).re(), actual.get(i).re(), tol, what + "[" + i + "].re");
            assertEquals(expected.get(i).im(), actual.get(i).im(), tol, what + "[" + i + "].im");
        }
    }

    @ParameterizedTest
    @ValueSource(doubles = {20, 1000, 8000, 15000, 19800})
    void perRootPutsARealPoleWhereTheTangentRuleSays(double cornerHz) {
        double fs = 44100;
        Zpk lowpass = new Zpk(List.of(), List.of(Complex.real(-TWO_PI * cornerHz)), TWO_PI * cornerHz);
        DigitalZpk d = Bilinear.discretize(lowpass, fs, PrewarpRule.PER_ROOT, 0);
        // reference: closed form of the prewarped bilinear pole, z = (1 − tan(π·fc/fs)) / (1 + tan(π·fc/fs))
        // (tan prewarping, Oppenheim & Schafer, bilinear transformation; common practice)
        double t = Math.tan(Math.PI * cornerHz / fs);
        assertEquals((1 - t) / (1 + t), d.poles().get(0).re(), 1e-15, "pole; tolerance: a few ulp");
        assertEquals(-1.0, d.zeros().get(0).re(), 0.0, "zero at infinity goes to z = -1 (scipy.signal.bilinear_zpk)");
        // the corner lands exactly: a first-order low-pass is 1/sqrt(2) of its DC gain at its corner (closed form)
        double ratio = d.response(cornerHz).abs() / d.response(0).abs();
        assertEquals(Math.sqrt(0.5), ratio, 1e-13, "|H(fc)|/|H(0)|; tolerance: rounding of tan and products");
    }

    @ParameterizedTest
    @ValueSource(doubles = {500, 6000, 16000})
    void perRootLandsARealZeroCornerExactly(double cornerHz) {
        double fs = 48000;
        // a zero alone with a pole far below it: the zero's image is z = (1 − t)/(1 + t), t = tan(π·fz/fs)
        Zpk shelf = new Zpk(List.of(Complex.real(-TWO_PI * cornerHz)), List.of(Complex.real(-TWO_PI * 5)), 1);
        DigitalZpk d = Bilinear.discretize(shelf, fs, PrewarpRule.PER_ROOT, 1000);
        double t = Math.tan(Math.PI * cornerHz / fs);
        // reference: closed form of the prewarped bilinear map (common practice); tolerance: a few ulp
        assertEquals((1 - t) / (1 + t), d.zeros().get(0).re(), 1e-15);
    }

    @ParameterizedTest
    @ValueSource(doubles = {0.5, 0.707, 3, 10})
    void perRootKeepsTheQAndCornerOfAComplexPair(double q) {
        double fs = 44100;
        double f0 = 12000;
        double w0 = TWO_PI * f0;
        double re = -w0 / (2 * q);
        double im = w0 * Math.sqrt(Math.max(0, 1 - 1 / (4 * q * q)));
        Zpk lp = new Zpk(List.of(), List.of(new Complex(re, im), new Complex(re, -im)), w0 * w0);
        DigitalZpk d = Bilinear.discretize(lp, fs, PrewarpRule.PER_ROOT, 100);
        // closed form: a second-order low-pass w0²/(s² + s·w0/Q + w0²) has |H(j·w0)| = Q·|H(0)|; the bilinear map
        // of the prewarped pair reproduces the prewarped prototype at the warped frequency, so this holds at f0
        double ratio = d.response(f0).abs() / d.response(0).abs();
        assertEquals(q, ratio, q * 1e-12, "tolerance: rounding in tan, roots and products");
    }

    @Test
    void plainBilinearMissesTheCornerThatPrewarpingLands() {
        double fs = 44100;
        double fc = 15000;
        Zpk lowpass = new Zpk(List.of(), List.of(Complex.real(-TWO_PI * fc)), TWO_PI * fc);
        DigitalZpk d = Bilinear.discretize(lowpass, fs, PrewarpRule.NONE, 0);
        double ratio = d.response(fc).abs() / d.response(0).abs();
        // warping squeezes the corner down, so at fc the plain map is well below -3.01 dB (0.707)
        assertTrue(ratio < 0.6, "ratio " + ratio);
    }

    @Test
    void perRootMatchesTheAnalogMagnitudeAtTheGainMatchFrequency() {
        Zpk pink = OversamplingTest.pinkNetwork();
        for (double gm : new double[] {20, 1000, 19000}) {
            DigitalZpk d = Bilinear.discretize(pink, 48000, PrewarpRule.PER_ROOT, gm);
            double expected = pink.evaluateAtHz(gm).abs();
            // tolerance: rounding of two products of 10 factors each
            assertEquals(expected, d.response(gm).abs(), expected * 1e-12, "at " + gm + " Hz");
        }
    }

    @Test
    void negativeGainKeepsItsSign() {
        Zpk inverting = new Zpk(List.of(), List.of(Complex.real(-TWO_PI * 1000)), -TWO_PI * 1000);
        DigitalZpk d = Bilinear.discretize(inverting, 48000, 100);
        assertTrue(d.response(0).re() < 0, "inverting stage stays inverting at DC");
    }

    @Test
    void refusesAPoleInTheRightHalfPlane() {
        Zpk z = new Zpk(List.of(), List.of(Complex.real(TWO_PI * 12.3)), 1);
        UnrenderableModelException e = assertThrows(UnrenderableModelException.class,
                () -> Bilinear.discretize(z, 48000, 1000));
        assertEquals(Reason.RIGHT_HALF_PLANE_POLE, e.reason());
        assertEquals("pole at 12.3 Hz is in the right half-plane: the circuit would run away (its output grows"
                + " until it clips)", e.getMessage());
    }

    @Test
    void refusesAPolePairInTheRightHalfPlane() {
        Zpk z = new Zpk(List.of(), List.of(new Complex(10, TWO_PI * 440), new Complex(10, -TWO_PI * 440)), 1);
        UnrenderableModelException e = assertThrows(UnrenderableModelException.class,
                () -> Bilinear.discretize(z, 48000, 1000));
        assertEquals(Reason.RIGHT_HALF_PLANE_POLE, e.reason());
        assertEquals("pole pair at 440 Hz is in the right half-plane: the circuit would oscillate", e.getMessage());
    }

    @Test
    void refusesPolesOnTheAxis() {
        Zpk ring = new Zpk(List.of(), List.of(new Complex(0, TWO_PI * 1000), new Complex(0, -TWO_PI * 1000)), 1);
        UnrenderableModelException e = assertThrows(UnrenderableModelException.class,
                () -> Bilinear.discretize(ring, 48000, 100));
        assertEquals(Reason.POLE_ON_AXIS, e.reason());
        assertEquals("pole pair at 1000 Hz is on the jω axis: the circuit would ring forever (marginally stable)",
                e.getMessage());
        Zpk integrator = new Zpk(List.of(), List.of(Complex.ZERO), 1);
        e = assertThrows(UnrenderableModelException.class, () -> Bilinear.discretize(integrator, 48000, 100));
        assertEquals(Reason.POLE_ON_AXIS, e.reason());
        assertTrue(e.getMessage().startsWith("pole at 0 Hz (s = 0) is on the jω axis"), e.getMessage());
    }

    @Test
    void refusesImproperModels() {
        Zpk z = new Zpk(List.of(Complex.real(-1), Complex.real(-2)), List.of(Complex.real(-3)), 1);
        UnrenderableModelException e = assertThrows(UnrenderableModelException.class,
                () -> Bilinear.discretize(z, 48000, PrewarpRule.NONE, 100));
        assertEquals(Reason.IMPROPER, e.reason());
        assertEquals("the model has more zeros than poles (improper); add the op-amp model (opamp gbwHz) or a"
                + " series resistor", e.getMessage());
    }

    @Test
    void refusesZeroAndNonFiniteGain() {
        List<Complex> p = List.of(Complex.real(-100));
        UnrenderableModelException e = assertThrows(UnrenderableModelException.class,
                () -> Bilinear.discretize(new Zpk(List.of(), p, 0), 48000, 100));
        assertEquals(Reason.ZERO_GAIN, e.reason());
        assertEquals("the model gain is 0: the circuit would be silent", e.getMessage());
        e = assertThrows(UnrenderableModelException.class,
                () -> Bilinear.discretize(new Zpk(List.of(), p, Double.NaN), 48000, 100));
        assertEquals(Reason.NON_FINITE, e.reason());
        assertEquals("the model gain is NaN: check the component values", e.getMessage());
        e = assertThrows(UnrenderableModelException.class, () -> Bilinear.discretize(
                new Zpk(List.of(), List.of(Complex.real(Double.POSITIVE_INFINITY)), 1), 48000, 100));
        assertEquals(Reason.NON_FINITE, e.reason());
    }

    /**
     * Corners at or above 0.45·fs (here a zero at 30 kHz and a 1 MHz pole at 44.1 kHz) are scaled by
     * the limit's factor k = tan(0.45π)/(0.45π), so real roots a map to z = (2fs − k·|a|)/(2fs + k·|a|)
     * (bilinear image of a real root, closed form).
     */
    @Test
    void rootsAboveThePrewarpLimitGetTheLimitsFactor() {
        Zpk z = new Zpk(List.of(Complex.real(-TWO_PI * 30000)),
                List.of(Complex.real(-TWO_PI * 100), Complex.real(-TWO_PI * 1e6)), 1);
        DigitalZpk warped = Bilinear.discretize(z, 44100, PrewarpRule.PER_ROOT, 1000);
        double k = Math.tan(0.45 * Math.PI) / (0.45 * Math.PI);
        double fs2 = 2 * 44100;
        double a = k * TWO_PI * 30000;
        assertEquals((fs2 - a) / (fs2 + a), warped.zeros().get(0).re(), 1e-14);
        double b = k * TWO_PI * 1e6;
        assertEquals((fs2 - b) / (fs2 + b), warped.poles().get(1).re(), 1e-14);
        // The 100 Hz pole is below the limit and lands exactly: z = (1 − t)/(1 + t), t = tan(π·100/fs).
        double t = Math.tan(Math.PI * 100 / 44100);
        assertEquals((1 - t) / (1 + t), warped.poles().get(0).re(), 1e-15);
    }

    @Test
    void rejectsBadRateAndGainMatchFrequency() {
        Zpk z = new Zpk(List.of(), List.of(Complex.real(-100)), 100);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Bilinear.discretize(z, -1, 100));
        assertTrue(e.getMessage().contains("sampleRateHz=-1.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> Bilinear.discretize(z, 48000, 24000));
        assertTrue(e.getMessage().contains("gainMatchHz=24000.0"), e.getMessage());
        Zpk highpass = new Zpk(List.of(Complex.ZERO), List.of(Complex.real(-100)), 1);
        e = assertThrows(IllegalArgumentException.class, () -> Bilinear.discretize(highpass, 48000, 0));
        assertTrue(e.getMessage().contains("falls on a zero"), e.getMessage());
    }
}
