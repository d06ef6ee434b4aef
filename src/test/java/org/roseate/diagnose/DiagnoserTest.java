package org.roseate.diagnose;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.Set;
import java.util.TreeSet;
import org.junit.jupiter.api.Test;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.model.CircuitModel;

/**
 * The estimator on measured spectra synthesised directly with their statistical scatter: the
 * "measurement" is the exact analog response of the built circuit (some parts moved) at 24 points
 * per decade, plus seeded normal scatter of a stated standard deviation, so a hundred trials run in
 * seconds. Full captures through the real command are in DiagnoseCommandTest.
 */
class DiagnoserTest {
    static final Path BENCH = Path.of("presets/bench-pink.json");
    static final Path PASSIVE = Path.of("presets/passive-pink.json");

    /** 24 points per decade from 20 Hz to 20 kHz: the band of a 48 kHz capture (common practice for audio). */
    static double[] grid() {
        int n = 3 * 24 + 1;
        double[] hz = new double[n];
        for (int i = 0; i < n; i++) {
            hz[i] = 20 * Math.pow(10, i / 24.0);
        }
        return hz;
    }

    /** 20·log10|H| of {@code design} with values replaced, straight from the model. */
    static double[] levels(Design design, Map<String, Double> values, double[] hz) {
        double[] re = new double[hz.length];
        double[] im = new double[hz.length];
        CircuitModel.of(design.withValues(values), "truth").response(hz, re, im);
        double[] db = new double[hz.length];
        for (int i = 0; i < hz.length; i++) {
            db[i] = 10 * Math.log10(re[i] * re[i] + im[i] * im[i]);
        }
        return db;
    }

    /**
     * A synthetic measured response: the truth plus N(0, u²) scatter per point, plus an arbitrary
     * level offset when the level is free (the solver must not need to know it).
     */
    static MeasuredResponse synthetic(Design design, Map<String, Double> truth, double uDb, boolean levelFree,
            Random rnd) {
        double[] hz = grid();
        double[] db = levels(design, truth, hz);
        double offset = levelFree ? -37.5 : 0;
        double[] u = new double[hz.length];
        boolean[] trusted = new boolean[hz.length];
        for (int i = 0; i < hz.length; i++) {
            db[i] += offset + uDb * rnd.nextGaussian();
            u[i] = uDb;
            trusted[i] = true;
        }
        return new MeasuredResponse(48000, hz, db, u, trusted, levelFree, "synthetic");
    }

    /** Every part drawn from its prior (normal on ln, σ = tolerance/2 as PartPrior states), kept inside its tolerance. */
    static Map<String, Double> withinTolerance(List<PartPrior> priors, Random rnd) {
        Map<String, Double> v = new HashMap<>();
        for (PartPrior p : priors) {
            double x;
            do {
                x = p.sigmaLn() * rnd.nextGaussian();
            } while (x < p.lowLimitLn() || x > p.highLimitLn());
            v.put(p.designator(), p.nominal() * Math.exp(x));
        }
        return v;
    }

    static Design read(Path p) {
        return DesignReader.read(p);
    }

    private static void checkMovedParts(Path file, Map<String, Double> factors, double uDb, boolean levelFree,
            long seed) {
        Design d = read(file);
        List<PartPrior> priors = PartPrior.of(d, Map.of());
        Random rnd = new Random(seed);
        Map<String, Double> truth = withinTolerance(priors, rnd);
        factors.forEach((k, f) -> truth.put(k, d.component(k).orElseThrow().value() * f));
        Diagnosis dx = Diagnoser.diagnose(d, "d", priors, synthetic(d, truth, uDb, levelFree, rnd), 0.95);
        Set<String> flagged = new TreeSet<>();
        dx.flagged().forEach(p -> flagged.add(p.designator()));
        assertEquals(new TreeSet<>(factors.keySet()), flagged, () -> "flagged parts; " + dx.parts());
        for (String k : factors.keySet()) {
            PartEstimate e = dx.parts().stream().filter(p -> p.designator().equals(k)).findFirst().orElseThrow();
            // Issue 16: moved values recovered within 3 %.
            assertEquals(1, e.estimate() / truth.get(k), 0.03, () -> k + ": " + e);
            assertTrue(e.low() <= e.estimate() && e.estimate() <= e.high());
        }
        assertFalse(dx.modelMisfit(), () -> "p=" + dx.misfitPValue());
    }

    @Test
    void invertingLadderTwoMovedPartsAreNamedAndRecovered() {
        // 0.02 dB per point: a 60 s, 48 kHz transfer capture at γ² ≈ 0.99 pools to about this at 1 kHz.
        checkMovedParts(BENCH, Map.of("C3", 1.25, "R4", 0.8), 0.02, false, 1);
    }

    @Test
    void invertingLadderFromANoiseSourceWithUnknownLevel() {
        // 0.05 dB per point: a 60 s noise-source capture pooled 24 per decade, above about 200 Hz.
        checkMovedParts(BENCH, Map.of("C2", 0.78), 0.05, true, 2);
    }

    @Test
    void dividerMovedPartsAreNamedAndRecovered() {
        checkMovedParts(PASSIVE, Map.of("C3", 1.3, "R3", 1.15), 0.02, false, 3);
    }

    @Test
    void dividerFromANoiseSource() {
        checkMovedParts(PASSIVE, Map.of("R4", 0.75), 0.05, true, 4);
    }

    @Test
    void unchangedBuildsAreNotFlaggedInAtLeast95Of100Trials() {
        for (Path file : List.of(BENCH, PASSIVE)) {
            Design d = read(file);
            List<PartPrior> priors = PartPrior.of(d, Map.of());
            int clean = 0;
            for (int trial = 0; trial < 100; trial++) {
                Random rnd = new Random(1000 + trial);
                Map<String, Double> truth = withinTolerance(priors, rnd);
                boolean free = trial % 2 == 1;
                Diagnosis dx = Diagnoser.diagnose(d, "d", priors, synthetic(d, truth, free ? 0.05 : 0.02, free, rnd), 0.95);
                clean += dx.flagged().isEmpty() ? 1 : 0;
            }
            // Issue 16: no part flagged at the stated confidence (95 %) in at least 95 of 100 trials.
            assertTrue(clean >= 95, file + ": clean in " + clean + " of 100");
        }
    }

    @Test
    void invertingStageAmbiguityGroupIsEveryPart() {
        // H = −Z_f/Z_in is unchanged when every R is multiplied by k and every C divided by k (impedance
        // scaling; the op-amp's finite gain enters only through Z_f/Z_in, so it too is unchanged).
        Design d = read(BENCH);
        List<PartPrior> priors = PartPrior.of(d, Map.of());
        Diagnosis dx = Diagnoser.diagnose(d, "d", priors, synthetic(d, Map.of(), 0.02, false, new Random(5)), 0.95);
        List<String> all = priors.stream().map(PartPrior::designator).toList();
        assertTrue(dx.ambiguityGroups().contains(all), () -> "groups " + dx.ambiguityGroups());
    }

    @Test
    void levelFreeSeparatesTheInputResistor() {
        // With the level unknown, R1 of an inverting stage only sets the gain: it is unresolved on its own,
        // and the impedance-scaling group remains among the others.
        Design d = read(BENCH);
        List<PartPrior> priors = PartPrior.of(d, Map.of());
        Diagnosis dx = Diagnoser.diagnose(d, "d", priors, synthetic(d, Map.of(), 0.05, true, new Random(6)), 0.95);
        assertTrue(dx.ambiguityGroups().contains(List.of("R1")), () -> "groups " + dx.ambiguityGroups());
        assertTrue(dx.ambiguityGroups().contains(List.of("R2", "C1", "R3", "C2", "R4", "C3", "R5", "C4")),
                () -> "groups " + dx.ambiguityGroups());
    }

    @Test
    void anExtraPartLeavesAResidualNoValuesRemove() throws java.io.IOException {
        // The build has a 1 nF capacitor across the input resistor that the design lacks: |H| rises by
        // up to 6 dB/octave above 3.4 kHz, a shape no values of the drawn parts can make. (A missing
        // part is not such a case: it looks like a value far out, which the fit reports as that.)
        Design d = read(BENCH);
        List<PartPrior> priors = PartPrior.of(d, Map.of());
        String text = java.nio.file.Files.readString(BENCH).replace("\"R1(47k)\"", "\"R1(47k) || C9(1n)\"");
        Design built = DesignReader.parse(text, "built");
        MeasuredResponse m = synthetic(built, Map.of(), 0.02, false, new Random(7));
        Diagnosis dx = Diagnoser.diagnose(d, "d", priors, m, 0.95);
        assertTrue(dx.modelMisfit(), () -> "p=" + dx.misfitPValue() + " residual " + dx.residualDb());
        assertTrue(dx.residualDb() > 5 * dx.expectedResidualDb(), () -> "residual " + dx.residualDb());
    }

    @Test
    void aCorrectModelIsNotCalledAMisfit() {
        Design d = read(BENCH);
        List<PartPrior> priors = PartPrior.of(d, Map.of());
        Diagnosis dx = Diagnoser.diagnose(d, "d", priors, synthetic(d, Map.of("C2", 3.9e-8 * 1.2), 0.02, false,
                new Random(8)), 0.95);
        assertFalse(dx.modelMisfit(), () -> "p=" + dx.misfitPValue());
        // The residual of a correct model is the scatter: within 30 % of the stated 0.02 dB for 73 points
        // (the RMS of 73 normal deviates has a relative standard deviation of about 1/√146 = 8 %).
        assertEquals(0.02, dx.residualDb(), 0.006);
    }

    /**
     * A synthetic transfer response with phase: the truth's |H| and arg H plus independent normal
     * scatter, u dB on the level and the same relative complex error on the phase, u·ln10/20 rad (a
     * circular complex error splits equally into log-magnitude and phase; Bendat and Piersol give the
     * same ε for both, sec. 9.2, from memory).
     */
    static MeasuredResponse syntheticWithPhase(Design design, Map<String, Double> truth, double uDb, Random rnd) {
        double[] hz = grid();
        double[] re = new double[hz.length];
        double[] im = new double[hz.length];
        CircuitModel.of(design.withValues(truth), "truth").response(hz, re, im);
        double uDeg = Math.toDegrees(uDb * Math.log(10) / 20);
        double[] db = new double[hz.length];
        double[] deg = new double[hz.length];
        double[] u = new double[hz.length];
        double[] ud = new double[hz.length];
        boolean[] trusted = new boolean[hz.length];
        for (int i = 0; i < hz.length; i++) {
            db[i] = 10 * Math.log10(re[i] * re[i] + im[i] * im[i]) + uDb * rnd.nextGaussian();
            deg[i] = Math.toDegrees(Math.atan2(im[i], re[i])) + uDeg * rnd.nextGaussian();
            u[i] = uDb;
            ud[i] = uDeg;
            trusted[i] = true;
        }
        return new MeasuredResponse(48000, hz, db, u, deg, ud, trusted, false, "synthetic with phase", 0);
    }

    @Test
    void withPhaseMovedPartsAreNamedAndRecovered() {
        Design d = read(BENCH);
        List<PartPrior> priors = PartPrior.of(d, Map.of());
        Random rnd = new Random(31);
        Map<String, Double> truth = withinTolerance(priors, rnd);
        truth.put("C3", d.component("C3").orElseThrow().value() * 1.25);
        truth.put("R4", d.component("R4").orElseThrow().value() * 0.8);
        Diagnosis dx = Diagnoser.diagnose(d, "d", priors, syntheticWithPhase(d, truth, 0.02, rnd), 0.95);
        Set<String> flagged = new TreeSet<>();
        dx.flagged().forEach(p -> flagged.add(p.designator()));
        assertEquals(Set.of("C3", "R4"), flagged, () -> "flagged parts; " + dx.parts());
        for (String k : List.of("C3", "R4")) {
            PartEstimate e = dx.parts().stream().filter(p -> p.designator().equals(k)).findFirst().orElseThrow();
            // Issue 16: moved values recovered within 3 %.
            assertEquals(1, e.estimate() / truth.get(k), 0.03, () -> k + ": " + e);
        }
        assertEquals(grid().length, dx.phasePoints());
        assertFalse(dx.modelMisfit(), () -> "p=" + dx.misfitPValue());
        // The inverting stage's impedance-scaling group leaves H itself unchanged, phase included.
        assertTrue(dx.ambiguityGroups().contains(priors.stream().map(PartPrior::designator).toList()),
                () -> "groups " + dx.ambiguityGroups());
    }

    @Test
    void withPhaseUnchangedBuildsAreNotFlaggedInAtLeast95Of100Trials() {
        for (Path file : List.of(BENCH, PASSIVE)) {
            Design d = read(file);
            List<PartPrior> priors = PartPrior.of(d, Map.of());
            int clean = 0;
            for (int trial = 0; trial < 100; trial++) {
                Random rnd = new Random(2000 + trial);
                Map<String, Double> truth = withinTolerance(priors, rnd);
                Diagnosis dx = Diagnoser.diagnose(d, "d", priors, syntheticWithPhase(d, truth, 0.02, rnd), 0.95);
                clean += dx.flagged().isEmpty() ? 1 : 0;
            }
            // Issue 16: no part flagged at the stated confidence (95 %) in at least 95 of 100 trials.
            assertTrue(clean >= 95, file + ": clean in " + clean + " of 100");
        }
    }

    @Test
    void phaseResolvesTheLoadCapacitorTheMagnitudeBarelySees() {
        // presets/ladder-rc.json: the unbuffered output section R6–C5 (with the 1 MΩ load R7). Its corner
        // moves |H| only a little inside the band, but arg H turns through it; with the phase the
        // capacitor is pinned well inside its 5 % tolerance (on a 44 s synthetic transfer capture read
        // through the measurement core, C5's 95 % interval went from ±4.97 % to ±1.44 %; the bar here
        // is half, on synthetic points).
        Design d = read(Path.of("presets/ladder-rc.json"));
        List<PartPrior> priors = PartPrior.of(d, Map.of("R", org.roseate.value.Tolerance.parse("1%"),
                "C", org.roseate.value.Tolerance.parse("5%")));
        MeasuredResponse m = syntheticWithPhase(d, Map.of(), 0.01, new Random(41));
        double withPhase = halfWidth(Diagnoser.diagnose(d, "d", priors, m, 0.95), "C5");
        double magnitudeOnly = halfWidth(Diagnoser.diagnose(d, "d", priors, m.withoutPhase(), 0.95), "C5");
        assertTrue(withPhase < 0.5 * magnitudeOnly, () -> "C5 ± " + withPhase + " with phase, " + magnitudeOnly + " without");
    }

    private static double halfWidth(Diagnosis dx, String designator) {
        PartEstimate e = dx.parts().stream().filter(p -> p.designator().equals(designator)).findFirst().orElseThrow();
        return (e.high() / e.low() - 1) / 2;
    }
}
