package org.roseate.digital;

import java.util.ArrayList;
import java.util.List;
import org.roseate.digital.UnrenderableModelException.Reason;
import org.roseate.model.BandPower;
import org.roseate.model.Zpk;

/**
 * Picks the oversampling factor (1, 2, 4 or 8) for rendering an analog model at an output rate, by
 * comparing band levels of the digital path ({@link OversampledFilter}, rule {@link PrewarpRule#PER_ROOT})
 * with the analog model.
 *
 * <p>Band level = 10·log10 ∫|H|² df ({@link BandPower}). Each band is integrated over
 * [low, min(high, edge)] with edge = {@link Decimator#audioPassbandEdgeHz(double)} (20 kHz at 44.1 kHz
 * and above), for the analog model and the digital path alike: a stream at fs carries nothing above
 * fs/2, so the top third-octave band (nominal 20 kHz, 17.8–22.4 kHz) is compared on 17.8–20 kHz.
 */
public final class Oversampling {
    /**
     * Factors tried, smallest first. 2× and 4× suffice for single pink stages; 8× and 16× are for
     * cascades with several excess poles (each maps to a zero at z = −1 that bends the top octave)
     * at 44.1 and 48 kHz: the band error falls as (f/(M·fs))².
     */
    private static final int[] FACTORS = {1, 2, 4, 8, 16};

    private Oversampling() {
    }

    /**
     * The smallest factor whose band levels all stay within ±toleranceDb of the analog model.
     *
     * @param bandLowHz   lower band edges in Hz, each &gt; 0 and below the audio passband edge
     * @param bandHighHz  upper band edges in Hz, each &gt; the matching lower edge; same length
     * @param toleranceDb allowed |digital − analog| per band in dB, &gt; 0
     * @param gainMatchHz gain-match frequency in Hz, 0 ≤ gainMatchHz &lt; outputRateHz/2
     * @throws UnrenderableModelException if the model cannot run, or (reason TOLERANCE_NOT_MET) if even
     *                                    the largest factor misses the tolerance; the message names the worst band
     */
    public static int choose(Zpk analog, double outputRateHz, double[] bandLowHz, double[] bandHighHz,
            double toleranceDb, double gainMatchHz) {
        FidelityReport best = select(analog, outputRateHz, bandLowHz, bandHighHz, toleranceDb, gainMatchHz);
        if (best.maxAbsDifferenceDb() <= toleranceDb) {
            return best.factor();
        }
        FidelityReport.Band w = best.worstBand();
        throw new UnrenderableModelException(Reason.TOLERANCE_NOT_MET, String.format(java.util.Locale.ROOT,
                "even at %dx oversampling the band %s-%s Hz differs from the model by %+.3f dB (tolerance %s dB)",
                best.factor(), Hz.format(w.lowHz()), Hz.format(w.comparedHighHz()), w.differenceDb(),
                Hz.format(toleranceDb)));
    }

    /**
     * The report of the smallest factor that meets ±toleranceDb, or, when none does, of the factor
     * with the smallest worst-band difference (so a caller can render anyway and say how close it is).
     * Arguments as in {@link #choose}.
     */
    public static FidelityReport select(Zpk analog, double outputRateHz, double[] bandLowHz, double[] bandHighHz,
            double toleranceDb, double gainMatchHz) {
        if (!(toleranceDb > 0) || !Double.isFinite(toleranceDb)) {
            throw new IllegalArgumentException("toleranceDb=" + toleranceDb + " must be finite and > 0");
        }
        FidelityReport best = null;
        for (int factor : FACTORS) {
            FidelityReport r = assess(analog, outputRateHz, factor, bandLowHz, bandHighHz, gainMatchHz);
            if (r.maxAbsDifferenceDb() <= toleranceDb) {
                return r;
            }
            if (best == null || r.maxAbsDifferenceDb() < best.maxAbsDifferenceDb()) {
                best = r;
            }
        }
        return best;
    }

    /**
     * Band-by-band comparison of the digital path at one factor against the analog model.
     *
     * @param factor 1, 2, 4, 8 or 16; other arguments as in {@link #choose}
     */
    public static FidelityReport assess(Zpk analog, double outputRateHz, int factor, double[] bandLowHz,
            double[] bandHighHz, double gainMatchHz) {
        if (bandLowHz.length != bandHighHz.length || bandLowHz.length == 0) {
            throw new IllegalArgumentException("bandLowHz (" + bandLowHz.length + ") and bandHighHz ("
                    + bandHighHz.length + ") must have the same non-zero length");
        }
        OversampledFilter path = OversampledFilter.design(analog, outputRateHz, factor, PrewarpRule.PER_ROOT,
                gainMatchHz);
        double edge = Decimator.audioPassbandEdgeHz(outputRateHz);
        List<FidelityReport.Band> bands = new ArrayList<>(bandLowHz.length);
        for (int i = 0; i < bandLowHz.length; i++) {
            double lo = bandLowHz[i];
            double hi = bandHighHz[i];
            if (!(lo > 0) || !(hi > lo) || !Double.isFinite(hi)) {
                throw new IllegalArgumentException("band " + i + " [" + lo + ", " + hi
                        + "] Hz must satisfy 0 < low < high");
            }
            if (!(lo < edge)) {
                throw new IllegalArgumentException("band " + i + " starts at " + lo + " Hz, at or above the "
                        + edge + " Hz audio edge of output rate " + outputRateHz + " Hz");
            }
            double top = Math.min(hi, edge);
            double digital = BandPower.levelDb(path::magnitudeSquared, lo, top);
            double model = BandPower.levelDb(f -> {
                double m = analog.evaluateAtHz(f).abs();
                return m * m;
            }, lo, top);
            bands.add(new FidelityReport.Band(lo, hi, top, digital - model));
        }
        return new FidelityReport(factor, outputRateHz, bands);
    }
}
