package org.roseate.sweep;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;
import org.junit.jupiter.api.Test;

class SweepAnalyzerTest {
    static final double FS = 48000;
    /** 20 Hz to 22 kHz in 5 s with 50 ms fades: full level from 21.5 Hz to 20.5 kHz. */
    static final SweepSpec SPEC = new SweepSpec(20, 22000, 5.0, 0.05, FS);

    @Test
    void theSweepsInstantaneousFrequencyFollowsTheExponentialLaw() {
        // Closed form (Farina 2000, eq. 2): f(t) = f1·e^{t/L}. Measured from the time between two
        // upward zero crossings around t; relative error of that estimate is about (Δf/f)² ≪ 1e-3.
        double[] x = SPEC.render(1.0);
        for (double t : new double[] {0.5, 2.0, 3.7}) {
            int n = (int) (t * FS);
            double c0 = -1;
            double c1 = -1;
            for (int i = n; i < x.length - 1 && c1 < 0; i++) {
                if (x[i] <= 0 && x[i + 1] > 0) {
                    double c = i + x[i] / (x[i] - x[i + 1]);
                    if (c0 < 0) {
                        c0 = c;
                    } else {
                        c1 = c;
                    }
                }
            }
            double measuredHz = FS / (c1 - c0);
            double expectedHz = 20 * Math.exp((c0 + c1) / 2 / FS / SPEC.rateConstantSeconds());
            assertEquals(expectedHz, measuredHz, 2e-3 * expectedHz, "at t=" + t);
        }
        assertEquals(5.0 * Math.log(2) / Math.log(1100), SPEC.harmonicAdvanceSeconds(2), 1e-12);
        assertEquals(5.0 * Math.log(3) / Math.log(1100), SPEC.harmonicAdvanceSeconds(3), 1e-12);
    }

    /**
     * The known filter between the channels (scipy.signal.butter sections, response from
     * scipy.signal.sosfreqz) is recovered within 0.05 dB from 50 Hz to 16 kHz (the issue's
     * requirement), phase within 0.5°, with the response delayed by 37 frames (removed from the
     * phase as the pure delay e^{-j2πf·37/fs}). Both channels carry seeded noise 100 dB below the sweep.
     */
    @Test
    void aKnownFilterBetweenTheChannelsIsRecovered() {
        int latency = 4800;
        int delay = 37;
        int len = SPEC.lengthFrames() + latency + (int) (SweepAnalyzer.requiredTailSeconds(SPEC) * FS) + 4800;
        double[] x = SPEC.render(0.5);
        double[] ref = SweepFixtures.delayed(x, latency, len);
        double[] resp = SweepFixtures.delayed(SweepFixtures.filter(x), latency + delay, len);
        addNoise(ref, 0.5e-5, 1);
        addNoise(resp, 0.5e-5, 2);
        SweepResult r = SweepAnalyzer.analyze(SPEC, ref, resp, 24);
        assertEquals(latency / FS, r.latencySeconds(), 1.0 / FS);
        int checked = 0;
        double worst = 0;
        for (SweepPoint p : r.points()) {
            if (p.hz() < 50 || p.hz() > 16000) {
                continue;
            }
            double expected = SweepFixtures.stored("magnitudeDb", p.hz());
            worst = Math.max(worst, Math.abs(p.magnitudeDb() - expected));
            assertEquals(expected, p.magnitudeDb(), 0.05, "at " + p.hz() + " Hz");
            assertTrue(p.magnitudeBoundDb() < 0.05, "bound at " + p.hz() + " Hz: " + p.magnitudeBoundDb());
            double expectedPhase = SweepFixtures.stored("phaseDeg", p.hz()) - 360 * p.hz() * delay / FS;
            double diff = Math.IEEEremainder(p.phaseDeg() - expectedPhase, 360);
            assertEquals(0, diff, 0.5, "phase at " + p.hz() + " Hz");
            checked++;
        }
        assertEquals(200, checked, "24 points per octave from 50 Hz to 16 kHz: i = -103 .. 96");
        // Over the whole grid, edges included, every stated bound holds.
        for (SweepPoint p : r.points()) {
            double magErr = Math.abs(p.magnitudeDb() - SweepFixtures.stored("magnitudeDb", p.hz()));
            double phaseErr = Math.abs(Math.IEEEremainder(p.phaseDeg() - SweepFixtures.stored("phaseDeg", p.hz())
                    + 360 * p.hz() * delay / FS, 360));
            assertTrue(magErr <= p.magnitudeBoundDb(), "|H| error " + magErr + " > bound " + p.magnitudeBoundDb() + " at " + p.hz());
            assertTrue(phaseErr <= p.phaseBoundDeg(), "phase error " + phaseErr + " > bound " + p.phaseBoundDeg() + " at " + p.hz());
        }
        System.out.printf("known filter: worst |error| 50 Hz-16 kHz %.4f dB%n", worst);
    }

    /**
     * A weakly nonlinear system, y = u + a·u² + b·u³ after the known filter u = g∗x. For a sine of
     * amplitude U at the nonlinearity (closed form from the trigonometric identities
     * sin² = (1 − cos 2θ)/2 and sin³ = (3 sin θ − sin 3θ)/4): the fundamental is U·(1 + 3bU²/4),
     * the 2nd harmonic a·U²/2, the 3rd b·U³/4. With U = A·|G(f)| the analyzer must give each
     * harmonic re the fundamental within 0.5 dB (the requirement) wherever it gives one.
     */
    @Test
    void harmonicLevelsOfAWeaklyNonlinearSystemAreRecovered() {
        double amplitude = 0.5;
        double a = 0.1;
        double b = 0.05;
        int latency = 2400;
        int len = SPEC.lengthFrames() + latency + (int) (SweepAnalyzer.requiredTailSeconds(SPEC) * FS) + 4800;
        double[] x = SPEC.render(amplitude);
        double[] u = SweepFixtures.filter(x);
        double[] y = new double[u.length];
        for (int i = 0; i < u.length; i++) {
            y[i] = u[i] + a * u[i] * u[i] + b * u[i] * u[i] * u[i];
        }
        SweepResult r = SweepAnalyzer.analyze(SPEC, SweepFixtures.delayed(x, latency, len),
                SweepFixtures.delayed(y, latency, len), 24);
        int[] checked = new int[4];
        double[] worst = new double[4];
        for (SweepPoint p : r.points()) {
            double g = Math.pow(10, SweepFixtures.stored("magnitudeDb", p.hz()) / 20);
            double uAmp = amplitude * g;
            double fundamental = uAmp * (1 + 0.75 * b * uAmp * uAmp);
            double[] expected = {0, 0, 20 * Math.log10(a * uAmp * uAmp / 2 / fundamental),
                20 * Math.log10(b * uAmp * uAmp * uAmp / 4 / fundamental)};
            if (p.hz() >= 50 && p.hz() <= 16000) {
                // Same 0.05 dB as the linear filter; below 50 Hz the slowly varying DC term a·U²/2 leaks in.
                assertEquals(20 * Math.log10(fundamental / amplitude), p.magnitudeDb(), 0.05, "fundamental at " + p.hz());
            }
            for (int k = 2; k <= 3; k++) {
                double got = p.harmonicDb(k);
                if (Double.isNaN(got)) {
                    assertTrue(!SweepAnalyzer.harmonicInRange(SPEC, k, p.hz()) || expected[k] < -100,
                            "harmonic " + k + " missing at " + p.hz() + " Hz");
                    continue;
                }
                worst[k] = Math.max(worst[k], Math.abs(got - expected[k]));
                assertEquals(expected[k], got, 0.5, "harmonic " + k + " at " + p.hz() + " Hz");
                assertTrue(Math.abs(got - expected[k]) <= p.harmonicBoundDb(k), "stated bound at " + p.hz() + " Hz");
                checked[k]++;
            }
        }
        // Where harmonicInRange allows: about 8 octaves of fundamentals for the 2nd, 7.4 for the 3rd, 24 per octave.
        assertTrue(checked[2] >= 190 && checked[3] >= 175, "harmonics checked: " + checked[2] + ", " + checked[3]);
        System.out.printf("nonlinear: worst |error| HD2 %.3f dB over %d points, HD3 %.3f dB over %d points%n",
                worst[2], checked[2], worst[3], checked[3]);
    }

    @Test
    void aRecordingWithoutTailOrSweepIsRefusedWithOneLine() {
        double[] x = SPEC.render(0.5);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> SweepAnalyzer.analyze(SPEC, x, x, 24));
        assertTrue(e.getMessage().contains("ends too soon"), e.getMessage());
        double[] silent = new double[SPEC.lengthFrames() * 2];
        e = assertThrows(IllegalArgumentException.class, () -> SweepAnalyzer.analyze(SPEC, silent, silent, 24));
        assertTrue(e.getMessage().contains("no sweep"), e.getMessage());
        assertFalse(e.getMessage().contains("\n"));
    }

    static void addNoise(double[] x, double sigma, long seed) {
        RandomGenerator g = RandomGeneratorFactory.of("L64X128MixRandom").create(seed);
        for (int i = 0; i < x.length; i++) {
            x[i] += sigma * g.nextGaussian();
        }
    }
}
