package org.roseate.noise;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.circuit.DesignReader;
import org.roseate.model.BandPower;
import org.roseate.compare.TargetSlope;
import org.roseate.digital.FidelityReport;
import org.roseate.digital.OversampledFilter;
import org.roseate.model.CircuitModel;
import org.roseate.model.Zpk;
import org.roseate.spectrum.BandLevel;
import org.roseate.spectrum.BandLevels;
import org.roseate.spectrum.SpectralDensity;
import org.roseate.spectrum.WelchEstimator;
import org.roseate.spectrum.WelchSettings;

class NoiseChainTest {
    private static Zpk preset(String name) {
        return CircuitModel.of(DesignReader.read(Path.of("presets", name)), name).zpk();
    }

    private static double[] render(NoiseChain c, int frames, int block) {
        double[] all = new double[frames * c.channels()];
        double[] buf = new double[block * c.channels()];
        for (int done = 0; done < frames; done += block) {
            int n = Math.min(block, frames - done);
            c.render(buf, n);
            System.arraycopy(buf, 0, all, done * c.channels(), n * c.channels());
        }
        return all;
    }

    /** Chunked rendering equals whole rendering, bit for bit, for odd and tiny blocks. */
    @Test
    void chunkedEqualsWhole() {
        ChainSettings s = new ChainSettings(44100, 2, false, 7, -20);
        double[] whole = render(NoiseChain.design(preset("bench-pink.json"), s), 6000, 6000);
        for (int block : new int[] {1, 3, 64, 511, 513}) {
            assertArrayEquals(whole, render(NoiseChain.design(preset("bench-pink.json"), s), 6000, block), "block " + block);
        }
    }

    @Test
    void sameSeedSameSamplesOtherSeedOtherSamples() {
        ChainSettings s = new ChainSettings(48000, 1, false, 42, -20);
        double[] a = render(NoiseChain.design(preset("wide-pink.json"), s), 5000, 700);
        double[] b = render(NoiseChain.design(preset("wide-pink.json"), s), 5000, 700);
        double[] c = render(NoiseChain.design(preset("wide-pink.json"), new ChainSettings(48000, 1, false, 43, -20)), 5000, 700);
        assertArrayEquals(a, b);
        assertFalse(java.util.Arrays.equals(a, c));
        NoiseChain r = NoiseChain.design(preset("wide-pink.json"), s);
        double[] first = render(r, 5000, 5000);
        r.reset();
        assertArrayEquals(first, render(r, 5000, 5000), "reset restarts the stream");
    }

    /** Identical channels carry the same samples; independent ones are uncorrelated. */
    @Test
    void channelModes() {
        int n = 200_000;
        double[] same = render(NoiseChain.white(new ChainSettings(48000, 2, true, 3, -20)), n, 4096);
        for (int i = 0; i < n; i++) {
            assertEquals(same[2 * i], same[2 * i + 1]);
        }
        double[] ind = render(NoiseChain.white(new ChainSettings(48000, 2, false, 3, -20)), n, 4096);
        double sxy = 0;
        double sxx = 0;
        double syy = 0;
        for (int i = 0; i < n; i++) {
            sxy += ind[2 * i] * ind[2 * i + 1];
            sxx += ind[2 * i] * ind[2 * i];
            syy += ind[2 * i + 1] * ind[2 * i + 1];
        }
        double rho = sxy / Math.sqrt(sxx * syy);
        // Sample correlation of independent white noise has standard deviation 1/√n: allow 5σ.
        assertTrue(Math.abs(rho) < 5 / Math.sqrt(n), "rho=" + rho);
    }

    /**
     * The RMS level lands on the request without trial runs. Tolerance: the normalised random error
     * of a mean-square estimate of Gaussian noise over T seconds is ε = 1/√(B_s·T), with the
     * statistical bandwidth B_s = (∫G df)²/∫G² df of the output density G (Bendat &amp; Piersol,
     * Random Data, mean-square estimates; from memory). 4σ in dB is 4·4.343·ε, and the test also
     * checks that this bound is within the brief's 0.1 dB.
     */
    @ParameterizedTest
    @ValueSource(strings = {"bench-pink.json", "passive-pink.json", "wide-pink.json"})
    void rmsLevelWithinATenthOfADecibel(String name) {
        double fs = 48000;
        double seconds = 120;
        NoiseChain c = NoiseChain.design(preset(name), new ChainSettings(fs, 1, false, 11, -23.5));
        OversampledFilter f = c.filter().orElseThrow();
        double p1 = BandPower.integrate(f::magnitudeSquared, 1e-3, fs / 2);
        double p2 = BandPower.integrate(hz -> Math.pow(f.magnitudeSquared(hz), 2), 1e-3, fs / 2);
        double bs = p1 * p1 / p2;
        double sigmaDb = 10 * Math.log10(Math.E) / Math.sqrt(bs * seconds);
        assertTrue(4 * sigmaDb <= 0.1, name + ": 4σ = " + 4 * sigmaDb + " dB must fit the 0.1 dB target");
        SignalStatistics st = new SignalStatistics();
        double[] buf = new double[8192];
        long frames = (long) (seconds * fs);
        for (long done = 0; done < frames; done += buf.length) {
            int n = (int) Math.min(buf.length, frames - done);
            c.render(buf, n);
            st.accept(buf, 0, n);
        }
        assertEquals(-23.5, st.rmsDbfs(), 4 * sigmaDb, name + " (σ = " + sigmaDb + " dB)");
    }

    @Test
    void whiteNoiseLevel() {
        NoiseChain c = NoiseChain.white(new ChainSettings(44100, 1, false, 5, -12));
        SignalStatistics st = new SignalStatistics();
        double[] buf = new double[44100];
        for (int i = 0; i < 10; i++) {
            c.render(buf, buf.length);
            st.accept(buf, 0, buf.length);
        }
        // White noise: B_s = fs/2, ε = 1/√(fs/2·10 s) ≈ 0.0015, 4σ in dB ≈ 0.026 dB.
        assertEquals(-12, st.rmsDbfs(), 0.026);
    }

    /**
     * The rendered noise's third-octave levels follow the analog model. Each band's tolerance is
     * four times its stated uncertainty, ε = 1/√(B·T_eff) (bandwidth-time product; Bendat &amp;
     * Piersol, as in {@link BandLevels#relativeError}), plus the band's known, deterministic
     * digital-versus-analog difference from the fidelity report. At 48 kHz the decimator passes the
     * whole 20 kHz band (17.8–22.4 kHz), so the top band is predicted by the analog model alone and must
     * lie within ±0.1 dB (the fidelity target) + 4σ of it (issue 12, item 7). At 44.1 kHz the part of that
     * band above the decimator's passband edge is predicted with the chain's own decimator response.
     */
    @ParameterizedTest(name = "{0} at {1} Hz")
    @org.junit.jupiter.params.provider.CsvSource({"bench-pink.json, 48000", "ideal, 48000", "random-voltage.json, 44100"})
    void renderedSpectrumFollowsTheAnalogModel(String name, double fs) {
        // bench-pink runs 8× oversampled, the ideal pink 8× and the two-stage design 16×.
        Zpk z = name.equals("ideal") ? IdealPink.DEFAULT_PINK : preset(name);
        NoiseChain c = NoiseChain.design(z, new ChainSettings(fs, 1, false, 21, -20));
        BandTable t = BandTable.of(BandFraction.THIRD_OCTAVE, 20, 20000);
        WelchEstimator w = new WelchEstimator();
        w.prepare(fs, WelchSettings.of(BandLevels.autoSegmentLength(fs, t)));
        double[] buf = new double[16384];
        for (int i = 0; i < 60 * fs / buf.length; i++) {
            c.render(buf, buf.length);
            w.accept(buf, 0, buf.length);
        }
        SpectralDensity d = w.snapshot();
        List<BandLevel> measured = BandLevels.of(d, t);
        FidelityReport fid = c.fidelity().orElseThrow();
        // Predicted output density: gain²·|H_a(f)|²·2/(M·fs) FS²/Hz (unit-variance white input at
        // M·fs has one-sided density 2/(M·fs); decimation keeps the density below fs/2).
        double scale = c.gain() * c.gain() * 2 / (c.oversamplingFactor() * fs);
        for (int i = 0; i < t.size(); i++) {
            var b = t.band(i);
            double audioTop = Math.min(b.highHz(), org.roseate.digital.Decimator.audioPassbandEdgeHz(fs));
            double power = BandPower.integrate(hz -> {
                var h = z.evaluateAtHz(hz);
                return h.re() * h.re() + h.im() * h.im();
            }, b.lowHz(), audioTop);
            if (b.highHz() > audioTop) {
                OversampledFilter f = c.filter().orElseThrow();
                power += BandPower.integrate(f::magnitudeSquared, audioTop, b.highHz());
            }
            double predicted = 10 * Math.log10(2 * scale * power);
            BandLevel m = measured.get(i);
            double tol = 4 * m.uncertaintyDb() + Math.abs(fid.bands().get(i).differenceDb());
            assertEquals(predicted, m.levelDb(), tol, "band " + b.label() + " (±" + m.uncertaintyDb() + " dB)");
            if (fs == 48000 && i == t.size() - 1) {
                assertEquals(22387.2, audioTop, 0.1, "the whole 20 kHz band is judged at 48 kHz");
                assertEquals(predicted, m.levelDb(), 0.1 + 4 * m.uncertaintyDb(), "20 kHz band at 48 kHz against the analog model");
            }
        }
    }

    /**
     * The ideal-pink reference, as rendered (its digital path), follows the exact −3.01 dB/octave
     * line within ±0.05 dB per third-octave band from 20 Hz to 20 kHz at every output rate. The top
     * band is compared up to 20 kHz, where audio stops.
     */
    @ParameterizedTest
    @ValueSource(doubles = {44100, 48000, 96000, 192000})
    void idealPinkFollowsTheLine(double fs) {
        NoiseChain c = NoiseChain.idealPink(new ChainSettings(fs, 1, false, 1, -20));
        OversampledFilter f = c.filter().orElseThrow();
        BandTable t = BandTable.of(BandFraction.THIRD_OCTAVE, 20, 20000);
        double max = Double.NEGATIVE_INFINITY;
        double min = Double.POSITIVE_INFINITY;
        for (var b : t.bands()) {
            double hi = Math.min(b.highHz(), 20000);
            double d = BandPower.levelDb(f::magnitudeSquared, b.lowHz(), hi)
                    - 10 * Math.log10(TargetSlope.PINK.bandPower(b.lowHz(), hi));
            max = Math.max(max, d);
            min = Math.min(min, d);
        }
        assertTrue((max - min) / 2 <= 0.05, "peak band deviation " + (max - min) / 2 + " dB at " + fs + " Hz");
    }

    /** Every preset renders within ±0.1 dB of its analog model in every third-octave band at 44.1 and 48 kHz. */
    @ParameterizedTest
    @ValueSource(doubles = {44100, 48000})
    void fidelityTargets(double fs) {
        for (String p : new String[] {"bench-pink.json", "wide-pink.json", "passive-pink.json", "random-voltage.json"}) {
            FidelityReport r = NoiseChain.design(preset(p), new ChainSettings(fs, 1, false, 1, -20)).fidelity().orElseThrow();
            assertTrue(r.maxAbsDifferenceDb() <= 0.1, p + " at " + fs + " Hz: " + r.maxAbsDifferenceDb());
            assertEquals(31, r.bands().size(), "20 Hz to 20 kHz third-octave bands");
        }
    }

    /**
     * At a control rate of 100 Hz the two-stage random-voltage design lands on its level too. Its power
     * lies below about 2 Hz, so the statistical bandwidth is small; the tolerance is 4σ with σ from
     * ε = 1/√(B_s·T) as in {@link #rmsLevelWithinATenthOfADecibel}.
     */
    @Test
    void controlRateChainRuns() {
        double fs = 100;
        double seconds = 3000;
        NoiseChain c = NoiseChain.design(preset("random-voltage.json"), new ChainSettings(fs, 1, false, 1, -12));
        OversampledFilter f = c.filter().orElseThrow();
        double p1 = BandPower.integrate(f::magnitudeSquared, 1e-5, fs / 2);
        double p2 = BandPower.integrate(hz -> Math.pow(f.magnitudeSquared(hz), 2), 1e-5, fs / 2);
        double sigmaDb = 10 * Math.log10(Math.E) / Math.sqrt(p1 * p1 / p2 * seconds);
        double[] buf = new double[(int) (fs * seconds)];
        c.render(buf, buf.length);
        SignalStatistics st = new SignalStatistics();
        st.accept(buf, 0, buf.length);
        assertEquals(-12, st.rmsDbfs(), 4 * sigmaDb, "σ = " + sigmaDb + " dB");
    }

    /**
     * Steady-state start: a one-pole low-pass with a 10 s time constant (pole at −0.1 rad/s, unity DC
     * gain) rendered at 100 Hz for 1 s from 4000 seeds. Started from rest, the mean power of such renders
     * would be about 10 dB under the request (E[y²](t) ∝ 1 − e^(−2t/τ), averaged over t ≤ 1 s with
     * τ = 10 s: 0.094); started in the stationary state it is the requested power from the first sample.
     * The reference is the definition of the level (AES17: −20 dBFS RMS is a mean power of 10^(−2)/2 in
     * full-scale units); the bound is 5 standard errors of the mean, the standard error taken from the
     * spread of the 4000 per-render powers themselves.
     */
    @Test
    void slowCircuitStartsAtItsLongRunLevel() {
        Zpk tenSeconds = new Zpk(List.of(), List.of(new org.roseate.model.Complex(-0.1, 0)), 0.1);
        NoiseChain base = NoiseChain.design(tenSeconds, new ChainSettings(100, 1, false, 1, -20));
        int renders = 4000;
        int frames = 100;
        double[] buf = new double[frames];
        double sum = 0;
        double sumSq = 0;
        for (int seed = 1; seed <= renders; seed++) {
            NoiseChain c = base.withSeed(seed);
            c.render(buf, frames);
            double p = 0;
            for (double v : buf) {
                p += v * v;
            }
            p /= frames;
            sum += p;
            sumSq += p * p;
        }
        double mean = sum / renders;
        double sd = Math.sqrt((sumSq / renders - mean * mean) / (renders - 1));
        double expected = Math.pow(10, -20 / 10.0) / 2;
        assertEquals(expected, mean, 5 * sd, "mean power " + mean + " ± " + sd + " (" + 10 * Math.log10(2 * mean) + " dBFS)");
        assertTrue(5 * sd < 0.25 * expected, "the bound must be tight enough to tell rest (−10 dB) from steady state");
    }
}
