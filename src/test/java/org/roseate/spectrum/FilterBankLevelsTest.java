package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.roseate.bands.Band;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;

class FilterBankLevelsTest {
    private static double[] sine(double hz, double fs, int n, double amplitude) {
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = amplitude * Math.sin(2 * Math.PI * hz * i / fs);
        }
        return x;
    }

    /**
     * Level of one band for a sine: 2 s to settle, then about 4 s averaged, cut to a whole number of the
     * sine's periods (to the nearest sample, so the part-cycle error is below 1/(samples averaged)).
     */
    private static double sineLevelDbfs(Band band, double fs, double hz, double amplitude) {
        FilterBank bank = new FilterBank();
        bank.prepare(fs, new BandTable(band.fraction(), List.of(band)));
        int settle = (int) (2 * fs);
        int averaged = (int) Math.round(Math.max(1, Math.round(4 * hz)) * fs / hz);
        double[] x = sine(hz, fs, settle + averaged, amplitude);
        bank.accept(x, 0, settle);
        bank.restartAveraging();
        bank.accept(x, settle, x.length - settle);
        return bank.levelDbfs(0);
    }

    @Test
    void fullScaleSineAtMidbandReadsZeroDbfs() {
        // 0 dBFS for a full-scale sine (AES17 convention, as BandLevels); ±0.05 dB as the issue asks. Expected
        // error: the gain at fm (< 0.01 dB), the start-up transient after 2 s (slowest decay for the 20 Hz
        // band e^(−7.3·2) ≈ 5e-7) and the part-cycle (< 1 sample in 4 s)
        for (BandFraction fr : BandFraction.values()) {
            for (Band b : BandTable.of(fr, 20, 20000).bands()) {
                assertEquals(0.0, sineLevelDbfs(b, 48000, b.midHz(), 1.0), 0.05, fr + " " + b.label());
            }
        }
    }

    @Test
    void filteredSinesFollowTheDesignedResponseAndTheClassLimits() {
        // time domain against the designed SOS response: |H|² of a sine is its level change (closed form).
        // 0.001 dB: transient and part-cycle as above, and TDF-II rounding (measured well below 1e-4 dB)
        double fs = 48000;
        Band[] bands = {Band.of(-17, BandFraction.THIRD_OCTAVE), Band.of(0, BandFraction.THIRD_OCTAVE),
                Band.of(0, BandFraction.OCTAVE)};
        int[] rows = {2, 4, 5, 6};
        for (Band band : bands) {
            FractionalOctaveFilter f = FractionalOctaveFilter.design(band, fs);
            double ref = sineLevelDbfs(band, fs, band.midHz(), 1.0);
            for (int r : rows) {
                for (int side : new int[] {-1, 1}) {
                    double omega = Math.pow(FilterBankDesignTest.ClassOneLimits.omega(r, band.fraction().b()), side);
                    double hz = omega * band.midHz();
                    double measured = ref - sineLevelDbfs(band, fs, hz, 1.0);
                    assertEquals(f.relativeAttenuationDb(hz), measured, 0.001, band.label() + " Ω=" + omega);
                    // reference: IEC 61260-1:2014 Table 1, class 1, transcribed from memory
                    double[] lim = FilterBankDesignTest.ClassOneLimits.at(omega, band.fraction().b());
                    assertTrue(measured >= lim[0] && measured <= lim[1], band.label() + " Ω=" + omega
                            + " ΔA=" + measured);
                }
            }
        }
    }

    @Test
    void narrowestBandAtHighRateIsAccurateAtFullRate() {
        // Why no decimation: the 20 Hz third-octave band at 192 kHz (poles 1.5e-4 from the unit circle) still
        // reads a midband sine at the designed gain and the −3.01 dB edges where designed. 0.001 dB: transient
        // and part-cycle as above; rounding in TDF-II double is far smaller (that is what this measures)
        Band b = Band.of(-17, BandFraction.THIRD_OCTAVE);
        double fs = 192000;
        FractionalOctaveFilter f = FractionalOctaveFilter.design(b, fs);
        double mid = sineLevelDbfs(b, fs, b.midHz(), 1.0);
        assertEquals(20 * Math.log10(f.magnitude(b.midHz())), mid, 0.001);
        assertEquals(10 * Math.log10(0.5), sineLevelDbfs(b, fs, b.lowHz(), 1.0), 0.001);
        assertEquals(10 * Math.log10(0.5), sineLevelDbfs(b, fs, b.highHz(), 1.0), 0.001);
    }

    @Test
    void whiteNoiseAgreesWithWelchPlusTheButterworthBandwidthBias() {
        double fs = 48000;
        BandTable table = BandTable.of(BandFraction.THIRD_OCTAVE, 100, 16000);
        double seconds = 60;
        double[] x = SpectrumReference.gaussian(20260611L, (int) (seconds * fs), 0.1);
        FilterBank bank = new FilterBank();
        bank.prepare(fs, table);
        bank.accept(x, 0, x.length);
        WelchEstimator welch = new WelchEstimator();
        welch.prepare(fs, WelchSettings.of(BandLevels.autoSegmentLength(fs, table)));
        welch.accept(x, 0, x.length);
        List<BandLevel> w = BandLevels.of(welch.snapshot(), table);
        List<FilterBankLevel> t = bank.levels();
        int sharp = 0;
        for (int i = 0; i < table.size(); i++) {
            Band b = table.band(i);
            FractionalOctaveFilter f = bank.filters().get(i);
            // known bias: white noise reads S·∫|H|²df through the filter and S·(f2 − f1) in the ideal band; for
            // f ≪ fs the ratio is (π/(2N))/sin(π/(2N)) = π/3 for N = 3, +0.200 dB (derived in
            // FractionalOctaveFilter.butterworthNoiseBandwidthRatio); near Nyquist the warping shrinks it
            double biasDb = 10 * Math.log10(f.noiseBandwidthHz() / b.widthHz());
            // combined uncertainty: ε = 1/√(B·T) for each estimate (Bendat and Piersol, from memory; the Welch
            // one with T_eff), summed in quadrature (conservative: both read the same noise, so their errors
            // are positively correlated); 3 standard deviations
            double epsFilter = 1 / Math.sqrt(b.widthHz() * seconds);
            double eps = Math.sqrt(epsFilter * epsFilter + w.get(i).relativeError() * w.get(i).relativeError());
            double tolDb = 3 * 10 * Math.log10(1 + eps);
            double diff = t.get(i).levelDbfs() - w.get(i).levelDb();
            assertEquals(biasDb, diff, tolDb, b.label() + " FB " + t.get(i).levelDbfs() + " Welch " + w.get(i).levelDb());
            if (tolDb < 0.1) {
                sharp++;
                // in these bands the test tells the bias apart from zero (it can fail without it)
                assertTrue(Math.abs(diff) > tolDb || biasDb < tolDb, b.label());
            }
        }
        assertTrue(sharp >= 8, "bands sharp enough to see the 0.2 dB bias: " + sharp);
        // the low bands' bias is the analog formula's (warping (πf/fs)² < 1e-3 at 1 kHz)
        int k1 = table.bands().indexOf(table.find(1000).orElseThrow());
        assertEquals(10 * Math.log10(Math.PI / 3),
                10 * Math.log10(bank.filters().get(k1).noiseBandwidthHz() / table.band(k1).widthHz()), 0.005);
    }

    @Test
    void blocksGiveBitwiseTheSameSumsAsTheWholeSignal() {
        double fs = 44100;
        BandTable table = BandTable.of(BandFraction.OCTAVE, 31.5, 8000);
        double[] x = SpectrumReference.gaussian(7L, 20_011, 0.3);
        FilterBank whole = new FilterBank();
        whole.prepare(fs, table);
        whole.accept(x, 0, x.length);
        for (int block : new int[] {1, 3, 64, 511, 513, 4096}) {
            FilterBank b = new FilterBank();
            b.prepare(fs, table);
            int off = 0;
            while (off < x.length) {
                int n = Math.min(block, x.length - off);
                b.accept(x, off, n);
                b.accept(x, off + n, 0); // empty blocks change nothing
                off += n;
            }
            assertEquals(whole.samples(), b.samples());
            for (int i = 0; i < table.size(); i++) {
                // bitwise: same sample order through the same arithmetic (SosFilter is block-invariant)
                assertEquals(Double.doubleToRawLongBits(whole.meanSquare(i)), Double.doubleToRawLongBits(b.meanSquare(i)),
                        "block " + block + " band " + i);
            }
        }
        // reset returns to the prepared state: the same signal gives the same sums again
        double first = whole.meanSquare(3);
        whole.reset();
        whole.accept(x, 0, x.length);
        assertEquals(Double.doubleToRawLongBits(first), Double.doubleToRawLongBits(whole.meanSquare(3)));
    }

    @Test
    void argumentsAndLifeCycleAreChecked() {
        FilterBank bank = new FilterBank();
        assertThrows(IllegalStateException.class, () -> bank.accept(new double[4], 0, 4));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> bank.prepare(-1, BandTable.of(BandFraction.OCTAVE, 100, 1000)));
        assertTrue(e.getMessage().contains("sampleRateHz=-1.0"), e.getMessage());
        bank.prepare(48000, BandTable.of(BandFraction.OCTAVE, 100, 1000));
        assertThrows(IllegalStateException.class, bank::levels);
        IllegalArgumentException r = assertThrows(IllegalArgumentException.class, () -> bank.accept(new double[4], 2, 3));
        assertTrue(r.getMessage().contains("offset=2, n=3"), r.getMessage());
        bank.accept(new double[4], 4, 0);
        assertThrows(IllegalStateException.class, () -> bank.meanSquare(0));
        bank.accept(new double[10], 0, 10);
        // exact silence reads −∞ dBFS (10·log10(0))
        assertEquals(Double.NEGATIVE_INFINITY, bank.levels().get(0).levelDbfs());
        assertEquals(10, bank.levels().get(0).samples());
    }

    /**
     * On pink noise the bank reads +0.196 dB (third-octave) above the FFT reading of the same noise: the
     * Butterworth band's noise bandwidth weighted by 1/f. Reference: the analog prototype integrated with
     * scipy (src/test/python/gen_filterbank_noise_bias.py, noise_bias.json). The noise is the ideal-pink
     * render (its bands follow −3.01 dB/octave within ±0.04 dB). Per band: 3 standard deviations of the
     * two readings' combined statistical error (as in the white-noise test), plus 0.01 dB for the digital
     * filter's warping and the render's departure from an exact 1/f density (both estimated, from the
     * spread of the bias over bands computed below).
     */
    @Test
    void pinkNoiseReadsTheButterworthPinkBiasAboveWelch() throws Exception {
        var ref = new com.fasterxml.jackson.databind.ObjectMapper().readTree(
                FilterBankLevelsTest.class.getResourceAsStream("/reference/spectrum/filterbank/noise_bias.json"));
        double pinkBiasDb = ref.get("thirdOctave").get("pinkDb").asDouble();
        double fs = 48000;
        double seconds = 60;
        BandTable table = BandTable.of(BandFraction.THIRD_OCTAVE, 200, 4000);
        var chain = org.roseate.noise.NoiseChain.idealPink(new org.roseate.noise.ChainSettings(fs, 1, false, 77, -20));
        FilterBank bank = new FilterBank();
        bank.prepare(fs, table);
        WelchEstimator welch = new WelchEstimator();
        welch.prepare(fs, WelchSettings.of(BandLevels.autoSegmentLength(fs, table)));
        double[] buf = new double[8192];
        for (int k = 0; k < seconds * fs / buf.length; k++) {
            chain.render(buf, buf.length);
            bank.accept(buf, 0, buf.length);
            welch.accept(buf, 0, buf.length);
        }
        List<BandLevel> w = BandLevels.of(welch.snapshot(), table);
        List<FilterBankLevel> t = bank.levels();
        double sum = 0;
        for (int i = 0; i < table.size(); i++) {
            Band b = table.band(i);
            double epsFilter = 1 / Math.sqrt(b.widthHz() * bank.samples() / fs);
            double eps = Math.sqrt(epsFilter * epsFilter + w.get(i).relativeError() * w.get(i).relativeError());
            double tolDb = 3 * 10 * Math.log10(1 + eps) + 0.01;
            double diff = t.get(i).levelDbfs() - w.get(i).levelDb();
            assertEquals(pinkBiasDb, diff, tolDb, b.label());
            sum += diff;
        }
        // the mean over the 14 bands: its statistical error is below the largest per-band 1σ (≤ 0.03 dB for
        // bands from 200 Hz at 60 s, the tolerance used), so the offset is clearly the stated one, not zero
        assertEquals(pinkBiasDb, sum / table.size(), 0.03);
    }
}
