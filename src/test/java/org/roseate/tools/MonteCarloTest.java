package org.roseate.tools;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.roseate.bands.Band;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.circuit.DividerStage;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.value.ComponentKind;
import org.roseate.value.Tolerance;

class MonteCarloTest {
    private static final double R = 10e3;
    private static final double C = 159.15494309189535e-9; // corner 1/(2πRC) = 100 Hz
    private static final double DB_PER_NEPER = 20 * Math.log10(Math.E);

    /** H = 1/(1 + jωRC): series R1, shunt C1. */
    static Design onePole(Map<String, Tolerance> tol) {
        return new Design("one pole", "", List.of(new DividerStage(new Component("R1", ComponentKind.RESISTOR, R),
                new Component("C1", ComponentKind.CAPACITOR, C), Optional.empty())), tol);
    }

    static MonteCarlo.Result run(Design d, int trials, long seed, int threads, double limitDb, FrequencyRange r) {
        return MonteCarlo.run(new MonteCarlo.Spec(d, r, TargetSlope.PINK, BandFraction.THIRD_OCTAVE, trials,
                Distribution.UNIFORM, seed, limitDb, threads, false), f -> { });
    }

    @Test
    void pointSensitivityOfOnePole() {
        Design d = onePole(Map.of());
        for (double hz : new double[] {10, 100, 1000, 10000}) {
            double x = 2 * Math.PI * hz * R * C;
            // reference: closed form, ∂(−10·log10(1 + (ωRC)²))/∂ln R = −20·log10(e)·(ωRC)²/(1 + (ωRC)²)
            double expected = -DB_PER_NEPER * x * x / (1 + x * x);
            // central difference with step 1e-4: truncation error ~1e-8 dB
            assertEquals(expected, MonteCarlo.pointDbPerNeper(d, "R1", hz), 1e-7);
            assertEquals(expected, MonteCarlo.pointDbPerNeper(d, "C1", hz), 1e-7);
        }
    }

    @Test
    void bandSensitivityOfOnePoleMatchesItsClosedForm() {
        MonteCarlo.Result res = run(onePole(Map.of("R", new Tolerance(0.01))), 10, 1, 1, 1, new FrequencyRange(20, 20000));
        MonteCarlo.PartSensitivity r1 = res.sensitivities().stream().filter(s -> s.designator().equals("R1")).findFirst().orElseThrow();
        for (int i = 0; i < res.table().size(); i++) {
            Band b = res.table().band(i);
            double a = 2 * Math.PI * R * C;
            double u1 = a * b.lowHz();
            double u2 = a * b.highHz();
            // reference: closed form. L = 10·log10 ∫ df/(1 + a²f²); ∫ df/(1+u²)·(1/a) = atan(u)/a and
            // ∫ u²/(1+u²)² du = (atan u − u/(1+u²))/2, so ∂L/∂ln R
            // = −(10/ln 10)·[atan u − u/(1+u²)] / [atan u], both from u1 to u2; per +1 %: × 0.01.
            double num = (Math.atan(u2) - u2 / (1 + u2 * u2)) - (Math.atan(u1) - u1 / (1 + u1 * u1));
            double den = Math.atan(u2) - Math.atan(u1);
            double expected = -0.01 * 10 / Math.log(10) * num / den;
            // central difference with step 1e-3 in ln R: error ~1e-7 of the value
            assertEquals(expected, r1.levelDbPerPercent()[i], 1e-6, b.label());
        }
        assertEquals(List.of("C1"), res.exact(), "C1 has no tolerance and is held exact");
    }

    @Test
    void highFrequencySpreadIsSensitivityTimesTheValueSpread() {
        // R and C both uniform ±1 %; far above the 100 Hz corner the level goes as −20·log10(RC), so
        // level − median ≈ −8.686·t·(uR + uC) with uR, uC uniform on [−1, 1]. Their sum is triangular
        // on [−2, 2]: P(sum > s) = (2 − s)²/8 (closed form), so the 95th percentile is 2 − √0.4.
        double t = 0.01;
        MonteCarlo.Result res = run(onePole(Map.of("R", new Tolerance(t), "C", new Tolerance(t))), 8000, 11, 2, 1,
                new FrequencyRange(8000, 12500));
        MonteCarlo.BandSpread b = res.bands().get(res.bands().size() - 1);
        MonteCarlo.PartSensitivity s = res.sensitivities().get(0);
        double sensPerNeper = Math.abs(s.levelDbPerPercent()[res.bands().size() - 1]) / 0.01;
        assertEquals(DB_PER_NEPER, sensPerNeper, 0.01 * DB_PER_NEPER, "near −20·log10(e) well above the corner");
        double expectedHalfWidth = sensPerNeper * t * (2 - Math.sqrt(0.4));
        double measured = (b.levelDb().p95() - b.levelDb().p5()) / 2;
        double se = Math.hypot(b.levelDb().se5(), b.levelDb().se95()) / 2;
        // 4 standard errors of the order statistics, plus 1 % for ln(1 + t·u) ≠ t·u and the rounding of
        // the expected sensitivity
        assertEquals(expectedHalfWidth, measured, 4 * se + 0.01 * expectedHalfWidth);
    }

    @Test
    void twoSeedsAgreeWithinTheirSamplingError() {
        Design d = DesignReader.read(Path.of("presets/bench-pink.json"));
        FrequencyRange r = new FrequencyRange(20, 20000);
        MonteCarlo.Result a = run(d, 2000, 1, 2, 0.31, r);
        MonteCarlo.Result b = run(d, 2000, 2, 2, 0.31, r);
        // Percentiles: order-statistic standard errors (Quantiles); yield: binomial √(y(1−y)/N).
        // 4 combined standard errors: a false alarm has probability below 1e-4 per check.
        check(a.peakDb().p50(), b.peakDb().p50(), a.peakDb().se50(), b.peakDb().se50());
        check(a.peakDb().p95(), b.peakDb().p95(), a.peakDb().se95(), b.peakDb().se95());
        for (int i = 0; i < a.bands().size(); i += 5) {
            var qa = a.bands().get(i).deviationDb();
            var qb = b.bands().get(i).deviationDb();
            check(qa.p5(), qb.p5(), qa.se5(), qb.se5());
            check(qa.p95(), qb.p95(), qa.se95(), qb.se95());
        }
        assertTrue(a.yield() > 0.05 && a.yield() < 0.95, "a limit near the median makes the yield check meaningful: " + a.yield());
        check(a.yield(), b.yield(), a.yieldStandardError(), b.yieldStandardError());
        assertTrue(a.peakDb().p50() != b.peakDb().p50(), "different seeds draw different parts");
    }

    private static void check(double x, double y, double sx, double sy) {
        assertEquals(x, y, 4 * Math.hypot(sx, sy));
    }

    @Test
    void sameSeedSameResultWhateverTheThreadCount() {
        Design d = DesignReader.read(Path.of("presets/wide-pink.json"));
        FrequencyRange r = new FrequencyRange(20, 20000);
        MonteCarlo.Result one = run(d, 300, 5, 1, 1, r);
        MonteCarlo.Result two = run(d, 300, 5, 2, 1, r);
        assertEquals(one.peakDb(), two.peakDb());
        assertEquals(one.maxPeakDb(), two.maxPeakDb());
        assertArrayEquals(one.histogram().counts(), two.histogram().counts());
        for (int i = 0; i < one.bands().size(); i++) {
            assertEquals(one.bands().get(i), two.bands().get(i));
        }
        long total = 0;
        for (long c : one.histogram().counts()) {
            total += c;
        }
        assertEquals(300, total);
    }

    @Test
    void sensitivitiesAreRankedByContributionWithTheRawSensitivityBeside() {
        // One pole: R1 and C1 have the same sensitivity (only their product RC appears), so the
        // ranking must follow the tolerance alone: C1 at 5 % above R1 at 1 %, contribution = raw × percent.
        MonteCarlo.Result res = run(onePole(Map.of("R", new Tolerance(0.01), "C", new Tolerance(0.05))), 10, 1, 1, 1,
                new FrequencyRange(20, 20000));
        MonteCarlo.PartSensitivity first = res.sensitivities().get(0);
        MonteCarlo.PartSensitivity second = res.sensitivities().get(1);
        assertEquals("C1", first.designator());
        assertEquals("R1", second.designator());
        assertEquals(first.maxShapeDb(), second.maxShapeDb(), 1e-9, "same raw sensitivity (closed form: only RC appears)");
        assertEquals(5 * first.maxShapeDb(), first.contributionDb(), 1e-12);
        assertEquals(1 * second.maxShapeDb(), second.contributionDb(), 1e-12);
    }

    /** H = −1/(1 + (1 + 1)/A): an inverting stage of gain −1 on a single-pole op-amp. */
    static Design unityInverter(double gbwHz, Map<String, Tolerance> tol) {
        return new Design("unity inverter", "", List.of(new org.roseate.circuit.InvertingStage(
                new Component("R1", ComponentKind.RESISTOR, 10e3), new Component("R2", ComponentKind.RESISTOR, 10e3),
                Optional.of(new org.roseate.circuit.OpAmp(gbwHz, 1e5)))), tol);
    }

    @Test
    void opAmpGainBandwidthSpreadsWhenAToleranceIsGivenForIt() {
        // Gain −1 on an op-amp of GBW 40 kHz: the closed-loop corner is GBW/2 = 20 kHz (noise gain 2,
        // closed form for a single-pole op-amp), so the top band's level depends on GBW and nothing else
        // varies. Judged against the nominal design, the spread must be zero without the U tolerance.
        FrequencyRange r = new FrequencyRange(1000, 20000);
        Design held = unityInverter(40e3, Map.of());
        Design spread = unityInverter(40e3, Map.of("U", new Tolerance(0.3)));
        MonteCarlo.Result a = MonteCarlo.run(new MonteCarlo.Spec(held, r, TargetSlope.WHITE, BandFraction.THIRD_OCTAVE, 200,
                Distribution.UNIFORM, 1, 1, 1, true), f -> { });
        MonteCarlo.Result b = MonteCarlo.run(new MonteCarlo.Spec(spread, r, TargetSlope.WHITE, BandFraction.THIRD_OCTAVE, 200,
                Distribution.UNIFORM, 1, 1, 1, true), f -> { });
        MonteCarlo.BandSpread topA = a.bands().get(a.bands().size() - 1);
        MonteCarlo.BandSpread topB = b.bands().get(b.bands().size() - 1);
        assertEquals(0, topA.levelDb().p95() - topA.levelDb().p5(), 2 * BinnedQuantiles.ERROR_DB, "no spread without U");
        assertTrue(topB.levelDb().p95() - topB.levelDb().p5() > 0.3, "GBW ±30 % moves the 20 kHz band: "
                + (topB.levelDb().p95() - topB.levelDb().p5()));
        assertEquals(List.of("U1"), b.toleranced().stream().filter(x -> x.startsWith("U")).toList());
        assertEquals("U1", b.sensitivities().get(0).designator(), "the op-amp is the only drawn part");
        // Against the nominal design, the nominal deviation is zero in every band by construction.
        for (MonteCarlo.BandSpread x : b.bands()) {
            assertEquals(0, x.nominalDeviationDb(), 1e-12);
        }
        assertEquals(0, b.nominalPeakDb(), 1e-12);
    }
}
