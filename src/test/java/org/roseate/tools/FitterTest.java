package org.roseate.tools;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.circuit.DesignWriter;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;
import org.roseate.value.ESeries;

class FitterTest {
    private static final FrequencyRange AUDIO = new FrequencyRange(20, 20000);
    /** Unity pink at 1 kHz: the gain a new ladder holds by default. */
    private static final GainHold UNITY_AT_1K = new GainHold(0, 1000);

    /** A new inverting ladder as {@code fit --branches N --series E24} makes it: every part free, unity gain at 1 kHz held. */
    static FitSpec inverting(int branches, int starts, int threads, long seed) {
        Design d = Topologies.invertingLadder(branches, OptionalDouble.empty(), Optional.empty(), PartLimits.DEFAULT, AUDIO);
        List<String> free = d.components().stream().map(Component::designator).toList();
        return new FitSpec(d, free, Optional.of(UNITY_AT_1K), AUDIO, TargetSlope.PINK, BandFraction.THIRD_OCTAVE,
                SeriesChoice.of(ESeries.E24), PartLimits.DEFAULT, starts, seed, threads, FitSpec.DEFAULT_POINTWISE_WEIGHT);
    }

    /** Re-reads the design from its file text and analyses it through the model package alone. */
    static DesignAnalysis independent(Design d) {
        Design back = DesignReader.parse(DesignWriter.toJson(d), "fitted.json");
        return DesignAnalysis.of(CircuitModel.of(back, "fitted.json"), AUDIO, TargetSlope.PINK, BandFraction.THIRD_OCTAVE,
                new double[] {1000});
    }

    static void checkStandardAndWithinLimits(Design d) {
        for (Component c : d.components()) {
            // reference: IEC 60063 E24 membership through ESeries.contains
            assertTrue(ESeries.E24.contains(c.value()), c + " is not an E24 value");
            assertTrue(c.value() >= PartLimits.DEFAULT.min(c.kind()) && c.value() <= PartLimits.DEFAULT.max(c.kind()), c + " outside the limits");
        }
    }

    @Test
    void threeBranchesReachTwoTenthsOfADecibelWithE24Parts() {
        FitResult r = Fitter.fit(inverting(3, 4, 2, 1), f -> { });
        DesignAnalysis a = independent(r.snapped());
        checkStandardAndWithinLimits(r.snapped());
        // The bar of the issue: third-octave band peak ≤ 0.2 dB, checked on the re-read design.
        assertTrue(a.bands().maxBandDeviationDb() <= 0.2, "band peak " + a.bands().maxBandDeviationDb());
        // The optimiser's own numbers equal the independent evaluation (same quadrature nodes,
        // other code and summation order: 1e-9 dB).
        assertEquals(a.bands().maxBandDeviationDb(), r.snappedScore().maxBandDeviationDb(), 1e-9);
        assertEquals(a.slope().maxDeviationDb(), r.snappedScore().maxDeviationDb(), 1e-9);
        assertEquals(a.bands().maxBandDeviationDb(), r.snappedAnalysis().bands().maxBandDeviationDb(), 1e-12);
        // (not re-read: the file text keeps values to 1e-9 relative only, which moves the peak by ~1e-9 dB)
        DesignAnalysis c = DesignAnalysis.of(CircuitModel.of(r.continuous(), "c"), AUDIO, TargetSlope.PINK,
                BandFraction.THIRD_OCTAVE, new double[] {1000});
        assertEquals(c.bands().maxBandDeviationDb(), r.continuousScore().maxBandDeviationDb(), 1e-9);
        // Snapping cannot beat the continuous optimum's shape by more than the search noise: the
        // continuous one is the minimum over a superset (its gain term is met at no cost in shape).
        double w = FitSpec.DEFAULT_POINTWISE_WEIGHT;
        assertTrue(r.continuousScore().maxBandDeviationDb() + w * r.continuousScore().maxDeviationDb()
                <= r.snappedScore().maxBandDeviationDb() + w * r.snappedScore().maxDeviationDb() + 1e-6);
        checkGainHeld(r);
    }

    /**
     * The gain is held: on continuous values exactly (a centred deviation does not see the overall
     * gain, so the optimum meets the gain term at no cost: 0.01 dB is the optimiser's stopping
     * noise), and after snapping within the discrete search's free slack, Fitter.STANDARD_GAIN_SLACK_DB
     * (0.2 dB), plus 0.02 dB that the steep penalty beyond it may still trade for shape (10 dB of J per
     * dB of gain against band peaks of ~0.1 dB). Both read through the exact model.
     */
    static void checkGainHeld(FitResult r) {
        assertEquals(0, r.continuousGainDb(), 0.01, "continuous gain at 1 kHz");
        assertEquals(0, r.snappedGainDb(), Fitter.STANDARD_GAIN_SLACK_DB + 0.02, "standard-value gain at 1 kHz");
        double model = 20 * Math.log10(CircuitModel.of(r.snapped(), "g").response(1000).abs());
        assertEquals(model, r.snappedGainDb(), 1e-12);
    }

    @Test
    void fourBranchesReachOneTenthOfADecibel() {
        FitResult r = Fitter.fit(inverting(4, 4, 2, 1), f -> { });
        DesignAnalysis a = independent(r.snapped());
        checkStandardAndWithinLimits(r.snapped());
        assertTrue(a.bands().maxBandDeviationDb() <= 0.1, "band peak " + a.bands().maxBandDeviationDb());
        assertEquals(a.bands().maxBandDeviationDb(), r.snappedScore().maxBandDeviationDb(), 1e-9);
        checkGainHeld(r);
    }

    @Test
    void heldPartsKeepTheirValuesBitForBit() {
        // A design with awkward, non-standard values: the held ones must come back unchanged,
        // compared as raw IEEE-754 bits, in both answers.
        Design d = Topologies.invertingLadder(2, OptionalDouble.of(51_234.5678), Optional.empty(), PartLimits.DEFAULT, AUDIO)
                .withValue("C2", 12.345678e-9).withValue("R3", 3.1415926e6);
        List<String> held = List.of("R1", "C2", "R3");
        List<String> free = d.components().stream().map(Component::designator).filter(x -> !held.contains(x)).toList();
        FitSpec s = new FitSpec(d, free, Optional.of(new GainHold(6, 1000)), AUDIO, TargetSlope.PINK, BandFraction.OCTAVE,
                new SeriesChoice(ESeries.E24, ESeries.E12), PartLimits.DEFAULT, 1, 5, 1, 0.1);
        FitResult r = Fitter.fit(s, f -> { });
        for (String h : held) {
            long want = Double.doubleToRawLongBits(d.component(h).orElseThrow().value());
            assertEquals(want, Double.doubleToRawLongBits(r.snapped().component(h).orElseThrow().value()), h + " standard");
            assertEquals(want, Double.doubleToRawLongBits(r.continuous().component(h).orElseThrow().value()), h + " continuous");
        }
        // R3 lies above the 2.2 MΩ limit but is held, so it is neither clamped nor reported.
        assertTrue(r.clamped().isEmpty(), r.clamped().toString());
    }

    @Test
    void aFreeValueOutsideTheLimitsIsClampedAndNamed() {
        Design d = Topologies.invertingLadder(1, OptionalDouble.of(47e3), Optional.empty(), PartLimits.DEFAULT, AUDIO)
                .withValue("R2", 10e6);
        List<String> free = d.components().stream().map(Component::designator).filter(x -> !x.equals("R1")).toList();
        FitSpec s = new FitSpec(d, free, Optional.empty(), AUDIO, TargetSlope.PINK, BandFraction.OCTAVE,
                SeriesChoice.of(ESeries.E24), PartLimits.DEFAULT, 1, 1, 1, 0.1);
        FitResult r = Fitter.fit(s, f -> { });
        assertEquals(List.of(new FitResult.ClampedValue("R2", 10e6, 2.2e6)), r.clamped());
    }

    @Test
    void resultDoesNotDependOnTheThreadCount() {
        FitResult one = Fitter.fit(inverting(1, 2, 1, 7), f -> { });
        FitResult two = Fitter.fit(inverting(1, 2, 2, 7), f -> { });
        assertArrayEquals(values(one.snapped()), values(two.snapped()));
        assertArrayEquals(values(one.continuous()), values(two.continuous()));
    }

    @Test
    void dividerWithLoadAndFreeValuesFromAFile() {
        Design start = Topologies.dividerLadder(2, OptionalDouble.of(1e6), PartLimits.DEFAULT, AUDIO);
        List<String> free = start.components().stream().map(Component::designator).filter(x -> !x.equals("R5")).toList();
        FitSpec s = new FitSpec(start, free, Optional.empty(), AUDIO, TargetSlope.PINK, BandFraction.OCTAVE,
                new SeriesChoice(ESeries.E24, ESeries.E12), PartLimits.DEFAULT, 2, 3, 2, 0);
        FitResult r = Fitter.fit(s, f -> { });
        assertEquals(1e6, r.snapped().component("R5").orElseThrow().value(), "the load is fixed");
        for (Component c : r.snapped().components()) {
            ESeries e = c.kind() == org.roseate.value.ComponentKind.RESISTOR ? ESeries.E24 : ESeries.E12;
            assertTrue(e.contains(c.value()), c + " not in " + e);
        }
        DesignAnalysis a = DesignAnalysis.of(CircuitModel.of(r.snapped(), "d"), AUDIO, TargetSlope.PINK, BandFraction.OCTAVE, new double[] {1000});
        assertEquals(a.bands().maxBandDeviationDb(), r.snappedScore().maxBandDeviationDb(), 1e-9);
        // The start's own band peak: the fit must improve on it.
        DesignAnalysis a0 = DesignAnalysis.of(CircuitModel.of(start, "s"), AUDIO, TargetSlope.PINK, BandFraction.OCTAVE, new double[] {1000});
        assertTrue(a.bands().maxBandDeviationDb() < a0.bands().maxBandDeviationDb());
    }

    @Test
    void aFreeInputResistorHoldsTheGainOnStandardValues() {
        Design d = Topologies.invertingLadder(1, OptionalDouble.empty(), Optional.empty(), PartLimits.DEFAULT, AUDIO);
        List<String> free = d.components().stream().map(Component::designator).toList();
        FitSpec s = new FitSpec(d, free, Optional.of(new GainHold(20, 1000)), AUDIO, TargetSlope.PINK, BandFraction.THIRD_OCTAVE,
                SeriesChoice.of(ESeries.E24), PartLimits.DEFAULT, 1, 1, 1, 0.1);
        FitResult r = Fitter.fit(s, f -> { });
        double gainDb = 20 * Math.log10(CircuitModel.of(r.snapped(), "g").response(1000).abs());
        // Within half an E24 step (≈ 0.42 dB: 20·log10(10^(1/48))) of 20 dB: the gain resistor alone
        // can always reach that by rounding, and the search only accepts moves that lower J.
        assertEquals(20, gainDb, 20 * Math.log10(Math.pow(10, 1.0 / 48)));
    }

    private static double[] values(Design d) {
        return d.components().stream().mapToDouble(Component::value).toArray();
    }
}
