package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;
import org.jtransforms.fft.DoubleFFT_1D;
import org.junit.jupiter.api.Test;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Design;

/**
 * Rice's zero-crossing rate (Rice, "Mathematical analysis of random noise", 1944/45) and the RMS
 * rate of change against seeded simulated records: Gaussian noise with the budget's own output
 * density over the range, synthesised by the spectral representation Rice used (independent
 * Gaussian Fourier coefficients, variance S(f_k)·Δf per bin), sign changes counted.
 */
class RiceCrossingTest {
    private static final int RATE_HZ = 1 << 19;
    private static final int RECORDS = 16;

    @Test
    void crossingsAndSlopeOfSimulatedRecordsMatchTheBudget() {
        // a source with a 1/f corner through an RC low-pass (corner 1.59 kHz)
        Design d = BudgetFixtures.rcLowPass("10k", "10n", "\"source\": {\"densityVPerRtHz\": 1e-4, \"flickerCornerHz\": 300},");
        double lo = 100;
        double hi = 20000;
        NoiseBudget b = NoiseBudget.of(d, "t");
        BudgetResult r = b.compute(lo, hi, new double[0], BandFraction.OCTAVE);
        int n = RATE_HZ; // 1 s records: bins 1 Hz apart
        double df = (double) RATE_HZ / n;
        double[] amp = new double[n / 2];
        for (int k = 1; k < n / 2; k++) {
            double f = k * df;
            // variance S(f)·Δf per bin; the scale of JTransforms' packed real inverse is checked
            // below by the records' RMS against the budget's outputRmsV
            amp[k] = f >= lo && f <= hi ? Math.sqrt(b.outputDensitySquared(f) * df) : 0;
        }
        DoubleFFT_1D fft = new DoubleFFT_1D(n);
        Random rnd = new Random(20261202L);
        double[] counts = new double[RECORDS];
        double[] slopes = new double[RECORDS];
        double[] rms = new double[RECORDS];
        for (int rec = 0; rec < RECORDS; rec++) {
            double[] a = new double[n];
            for (int k = 1; k < n / 2; k++) {
                a[2 * k] = amp[k] * rnd.nextGaussian();
                a[2 * k + 1] = amp[k] * rnd.nextGaussian();
            }
            fft.realInverse(a, false);
            int crossings = 0;
            double slope2 = 0;
            for (int i = 1; i < n; i++) {
                double x0 = a[i - 1];
                double x1 = a[i];
                if ((x0 < 0) != (x1 < 0)) {
                    crossings++;
                }
                double dx = (x1 - x0) * RATE_HZ;
                slope2 += dx * dx;
            }
            double p = 0;
            for (int i = 0; i < n; i++) {
                p += a[i] * a[i];
            }
            rms[rec] = Math.sqrt(p / n);
            counts[rec] = crossings * (double) RATE_HZ / (n - 1);
            slopes[rec] = Math.sqrt(slope2 / (n - 1));
        }
        // Bias allowance 0.5 %: the first difference reads a sine's slope low by sin(x)/x,
        // x = πf/fs, at most 0.24 % at 20 kHz of 524 kHz; sampling misses pairs of crossings
        // closer than one sample (1.9 µs, against a mean spacing near 110 µs here).
        check(r.outputRmsV(), rms, 0); // 4 standard errors, no bias
        check(r.zeroCrossingsPerS(), counts, 0.005);
        check(r.rateRmsVPerS(), slopes, 0.005);
    }

    /** The mean of the records against the expectation within 4 standard errors plus {@code biasRel}. */
    private static void check(double expected, double[] records, double biasRel) {
        double mean = 0;
        for (double v : records) {
            mean += v;
        }
        mean /= records.length;
        double var = 0;
        for (double v : records) {
            var += (v - mean) * (v - mean);
        }
        double se = Math.sqrt(var / (records.length - 1) / records.length);
        assertEquals(expected, mean, 4 * se + biasRel * expected, "mean of " + records.length + " records, standard error " + se);
    }
}
