package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.roseate.digital.UnrenderableModelException.Reason;
import org.roseate.model.Complex;
import org.roseate.model.Zpk;

class OversamplingTest {
    private static final double TWO_PI = 2 * Math.PI;

    /** Our own interleaved pink network: real poles and zeros alternating, about 2.6 octaves apart. */
    static Zpk pinkNetwork() {
        return realRoots(new double[] {30, 190, 1200, 7500}, new double[] {12, 75, 480, 3000, 19000});
    }

    /** The network named as an example in the task (poles 10..16000 Hz, zeros 25..6300 Hz). */
    static Zpk examplePinkNetwork() {
        return realRoots(new double[] {25, 160, 1000, 6300}, new double[] {10, 60, 400, 2500, 16000});
    }

    private static Zpk realRoots(double[] zerosHz, double[] polesHz) {
        List<Complex> z = new ArrayList<>();
        List<Complex> p = new ArrayList<>();
        for (double f : zerosHz) {
            z.add(Complex.real(-TWO_PI * f));
        }
        for (double f : polesHz) {
            p.add(Complex.real(-TWO_PI * f));
        }
        return new Zpk(z, p, TWO_PI * polesHz[polesHz.length - 1]);
    }

    /** IEC 61260-1 base-ten third-octave bands x = −17..13: fm = 1000·10^(x/10), edges fm·10^(∓1/20). */
    static double[][] thirdOctaveBands() {
        double[] lo = new double[31];
        double[] hi = new double[31];
        for (int x = -17; x <= 13; x++) {
            double fm = 1000 * Math.pow(10, x / 10.0);
            lo[x + 17] = fm * Math.pow(10, -0.05);
            hi[x + 17] = fm * Math.pow(10, 0.05);
        }
        return new double[][] {lo, hi};
    }

    @ParameterizedTest
    @ValueSource(doubles = {44100, 48000})
    void automaticFactorKeepsEveryThirdOctaveWithinATenthOfADecibel(double fs) {
        double[][] b = thirdOctaveBands();
        int factor = Oversampling.choose(pinkNetwork(), fs, b[0], b[1], 0.1, 1000);
        FidelityReport r = Oversampling.assess(pinkNetwork(), fs, factor, b[0], b[1], 1000);
        assertEquals(factor, r.factor());
        assertEquals(31, r.bands().size());
        assertTrue(r.maxAbsDifferenceDb() <= 0.1, "worst " + r.worstBand());
        // the choice is the smallest: one factor lower misses (factor 1 is far off near 20 kHz)
        assertTrue(factor > 1);
        FidelityReport lower = Oversampling.assess(pinkNetwork(), fs, factor / 2, b[0], b[1], 1000);
        assertTrue(lower.maxAbsDifferenceDb() > 0.1, "factor " + factor / 2 + ": " + lower.worstBand());
        // the top band is compared up to the decimator's passband edge: the whole band (22.39 kHz) at
        // 48 kHz, 0.476·44100 = 20991.6 Hz at 44.1 kHz (above 22.05 kHz it cannot exist)
        assertEquals(fs == 48000 ? b[1][30] : 0.476 * 44100, r.bands().get(30).comparedHighHz(), 1e-6);
        assertEquals(b[1][0], r.bands().get(0).comparedHighHz(), 0.0);
    }

    @Test
    void theExampleNetworkNeedsEightTimesAt441kHz() {
        // with its last pole at 16 kHz the bilinear warping of the −6 dB/octave tail leaves more than 0.1 dB in the
        // 17.8–21.0 kHz part of the top band at 4× (176.4 kHz); the error falls as (f/fs)², so 8× meets ±0.1 dB
        double[][] b = thirdOctaveBands();
        assertTrue(Oversampling.assess(examplePinkNetwork(), 44100, 4, b[0], b[1], 1000).maxAbsDifferenceDb() > 0.1);
        assertEquals(8, Oversampling.choose(examplePinkNetwork(), 44100, b[0], b[1], 0.1, 1000));
        // at 48 kHz the whole 20 kHz band, to 22.39 kHz, is judged: the (f/fs)² error there needs 8× too
        assertEquals(8, Oversampling.choose(examplePinkNetwork(), 48000, b[0], b[1], 0.1, 1000));
        // a looser tolerance that 4× meets gives 4×: the choice is the smallest factor that meets it
        double at4 = Oversampling.assess(examplePinkNetwork(), 44100, 4, b[0], b[1], 1000).maxAbsDifferenceDb();
        assertEquals(4, Oversampling.choose(examplePinkNetwork(), 44100, b[0], b[1], at4 * 1.01, 1000));
        // a tolerance no factor meets is refused with the worst band named
        UnrenderableModelException e = assertThrows(UnrenderableModelException.class,
                () -> Oversampling.choose(examplePinkNetwork(), 44100, b[0], b[1], 0.001, 1000));
        assertEquals(Reason.TOLERANCE_NOT_MET, e.reason());
        assertTrue(e.getMessage().startsWith("even at 16x oversampling the band"), e.getMessage());
    }

    @Test
    void aRootAboveNyquistStillRenders() {
        // a pole at 30 kHz has no prewarped image at 44.1 kHz (it takes the 0.45·fs limit's factor); the
        // band criterion then asks for oversampling
        Zpk z = new Zpk(List.of(Complex.real(-TWO_PI * 100)),
                List.of(Complex.real(-TWO_PI * 30), Complex.real(-TWO_PI * 30000)), TWO_PI * 30000);
        double[][] b = thirdOctaveBands();
        int factor = Oversampling.choose(z, 44100, b[0], b[1], 0.5, 1000);
        assertTrue(factor >= 2, "factor " + factor);
    }

    @Test
    void refusalsPassThroughAndArgumentsAreChecked() {
        double[][] b = thirdOctaveBands();
        Zpk unstable = new Zpk(List.of(), List.of(Complex.real(TWO_PI * 5)), 1);
        UnrenderableModelException e = assertThrows(UnrenderableModelException.class,
                () -> Oversampling.choose(unstable, 48000, b[0], b[1], 0.1, 1000));
        assertEquals(Reason.RIGHT_HALF_PLANE_POLE, e.reason());
        IllegalArgumentException bad = assertThrows(IllegalArgumentException.class,
                () -> Oversampling.choose(pinkNetwork(), 48000, b[0], b[1], 0, 1000));
        assertTrue(bad.getMessage().contains("toleranceDb=0.0"), bad.getMessage());
        assertThrows(IllegalArgumentException.class,
                () -> Oversampling.assess(pinkNetwork(), 48000, 2, new double[] {22500}, new double[] {23000}, 1000));
        assertThrows(IllegalArgumentException.class,
                () -> Oversampling.assess(pinkNetwork(), 48000, 2, new double[] {100}, new double[] {}, 1000));
    }
}
