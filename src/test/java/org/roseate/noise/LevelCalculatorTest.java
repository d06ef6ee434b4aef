package org.roseate.noise;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class LevelCalculatorTest {

    private static final double FS = 48000.0;

    @Test
    void whiteNoiseHasUnitPowerGain() {
        assertEquals(1.0, LevelCalculator.noisePowerGain(f -> 1.0, FS), 1e-12); // rounding of the panel sums
    }

    @Test
    void analogOnePoleMatchesTheArctangentClosedForm() {
        // |H|² = 1/(1 + (f/fc)²): ∫₀^B |H|² df = fc·atan(B/fc) (closed form), B = fs/2
        for (double fc : new double[] {0.001, 1.0, 20.0, 1000.0, 20000.0, 1e6}) {
            double expected = 2.0 / FS * fc * Math.atan(0.5 * FS / fc);
            double g = LevelCalculator.noisePowerGain(f -> 1.0 / (1.0 + (f / fc) * (f / fc)), FS);
            // integrator target 1e-10 relative; 1e-9 leaves room for the error estimate's optimism
            assertEquals(expected, g, 1e-9 * expected, "fc=" + fc);
        }
    }

    @Test
    void digitalOnePoleMatchesTheGeometricSeries() {
        // y[n] = a·y[n−1] + (1−a)·x[n]: h[n] = (1−a)aⁿ, Σh² = (1−a)²/(1−a²) (closed form);
        // |H(e^{jω})|² = (1−a)²/(1 − 2a·cos ω + a²), the denominator written (1−a)² + 4a·sin²(ω/2)
        // so that it keeps its digits near DC when a → 1
        for (double a : new double[] {0.0, 0.5, 0.99, 0.9999, 0.999999}) {
            double expected = (1 - a) * (1 - a) / (1 - a * a);
            double g = LevelCalculator.noisePowerGain(f -> {
                double sin = Math.sin(Math.PI * f / FS);
                return (1 - a) * (1 - a) / ((1 - a) * (1 - a) + 4 * a * sin * sin);
            }, FS);
            assertEquals(expected, g, 1e-9 * expected, "a=" + a); // as above
        }
    }

    @Test
    void gainGivesTheRequestedAes17Level() {
        // AES17: rms = 10^(L/20)/√2; unit-variance noise, G = 1, at 20·log10(0.25·√2) dBFS needs gain 0.25
        assertEquals(0.25, LevelCalculator.gainForLevel(1.0, 20 * Math.log10(0.25 * Math.sqrt(2))), 1e-15);
        for (double g : new double[] {1e-6, 0.0526, 1.0, 37.0}) {
            for (double level : new double[] {-60, -20, -3.01, 0, 6}) {
                double gain = LevelCalculator.gainForLevel(g, level);
                assertEquals(level, LevelCalculator.levelDbfs(g, gain), 1e-12); // inverse, rounding only
                assertEquals(Math.pow(10, level / 20) / Math.sqrt(2), gain * Math.sqrt(g), 1e-12);
            }
        }
    }

    @Test
    void filteredSeededNoiseLandsAtTheRequestedLevelWithoutTrialRuns() {
        double a = 0.9;
        double g = LevelCalculator.noisePowerGain(
                f -> (1 - a) * (1 - a) / (1 - 2 * a * Math.cos(2 * Math.PI * f / FS) + a * a), FS);
        double levelDbfs = -20.0;
        double gain = LevelCalculator.gainForLevel(g, levelDbfs);
        int n = 1_000_000;
        double[] x = new double[n];
        new WhiteNoiseSource(21L).fill(x, 0, n);
        double y = 0;
        for (int i = 0; i < n; i++) { // the one-pole, run here only as a test fixture
            y = a * y + (1 - a) * gain * x[i];
            x[i] = y;
        }
        SignalStatistics s = new SignalStatistics();
        s.accept(x, 0, n);
        // sample variance of an AR(1) with ρ = 0.9: se ≈ √(2(1 + 2ρ²/(1−ρ²))/n) = 4.4e-3 relative
        // = 0.019 dB; 5σ
        assertEquals(levelDbfs, s.rmsDbfs(), 0.1);
    }

    @Test
    void rejectsBadArguments() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> LevelCalculator.gainForLevel(0.0, -20))
                .getMessage().contains("=0.0"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> LevelCalculator.gainForLevel(1.0, Double.NaN))
                .getMessage().contains("levelDbfs=NaN"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> LevelCalculator.noisePowerGain(f -> 1, -1))
                .getMessage().contains("sampleRateHz=-1.0"));
        assertThrows(IllegalArgumentException.class, () -> LevelCalculator.noisePowerGain(f -> Double.NaN, FS));
    }
}
