package org.roseate.spectrum;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;
import org.roseate.compare.BandComparison;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;

/**
 * What a two-channel capture says about the circuit between them: the response at chosen
 * frequencies, and band levels of |H|² comparable with analyze's.
 *
 * <p>Band level here is 10·log10 ∫|H|² df over the band (fractional edge bins), the power that
 * unit-density white noise would have after the circuit: the same quantity analyze reports for a
 * design, so the two compare directly, whatever the excitation's spectrum. These levels carry no
 * uncertainty estimate (NaN).
 *
 * @param estimate           the (calibrated) H1 estimate per bin
 * @param points             the response at the requested frequencies
 * @param coherenceThreshold γ² at and above which a point is trusted
 * @param levels             band levels of |H|²
 * @param normalizedDb       levels minus the reference band's
 * @param referenceBand      the 1 kHz band or the one nearest it
 * @param slopeDbPerOctave   least-squares slope of |H|² per hertz implied by the band levels (level
 *                           minus 10·log10 of the band width), dB/octave, as analyze reports it
 * @param target             the target slope
 * @param deviation          levels against the target, centred
 * @param designDifferenceDb level minus the design's band level, mean removed; null without a design
 * @param designOffsetDb     that mean, dB; NaN without a design
 */
public record TransferResult(TransferEstimate estimate, List<Point> points, double coherenceThreshold,
        List<BandLevel> levels, double[] normalizedDb, Band referenceBand, double slopeDbPerOctave,
        TargetSlope target, BandComparison deviation, double[] designDifferenceDb, double designOffsetDb) {
    /**
     * γ² from which a point is trusted: 0.9. Then at least 90 % of the response power at that
     * frequency is linearly related to the reference, and the random error of |H| with n_d averages
     * is ε = √(1 − γ²)/(|γ|·√(2·n_d)) ≤ 0.24/√n_d (Bendat and Piersol, Random Data, 4th ed.,
     * sec. 9.2, from memory); below it noise, distortion or leakage dominate. The threshold is
     * common practice.
     */
    public static final double DEFAULT_COHERENCE_THRESHOLD = 0.9;

    public TransferResult {
        points = List.copyOf(points);
        levels = List.copyOf(levels);
        normalizedDb = normalizedDb.clone();
        designDifferenceDb = designDifferenceDb == null ? null : designDifferenceDb.clone();
    }

    @Override
    public double[] normalizedDb() {
        return normalizedDb.clone();
    }

    @Override
    public double[] designDifferenceDb() {
        return designDifferenceDb == null ? null : designDifferenceDb.clone();
    }

    /**
     * One response point.
     *
     * @param hz        frequency, Hz
     * @param db        20·log10|H|, dB
     * @param deg       arg H, degrees
     * @param coherence γ²
     * @param trusted   γ² ≥ the threshold
     * @param modelDb   the design's 20·log10|H| at hz, NaN without a design
     * @param targetDb  the target slope line through the measured level at the reference
     *                  frequency (the point nearest 1 kHz): db(ref) + slope·log2(hz/ref)
     */
    public record Point(double hz, double db, double deg, double coherence, boolean trusted, double modelDb,
            double targetDb) {
    }

    /**
     * @param hz        response frequencies, Hz, each within [fs/n, fs/2]
     * @param threshold coherence threshold, within [0, 1]
     * @param design    the design, or null
     * @throws IllegalArgumentException for a frequency outside the resolved range, a bad
     *                                  threshold, or a band wholly above Nyquist
     */
    public static TransferResult of(TransferEstimate estimate, double[] hz, double threshold, BandTable table,
            TargetSlope target, CircuitModel design) {
        Objects.requireNonNull(estimate, "estimate");
        Objects.requireNonNull(target, "target");
        if (!(threshold >= 0 && threshold <= 1)) {
            throw new IllegalArgumentException("threshold=" + threshold + " must be within [0, 1]");
        }
        if (hz.length == 0) {
            throw new IllegalArgumentException("no response frequencies");
        }
        List<TransferEstimate.Point> raw = new ArrayList<>();
        int ref = 0;
        for (int i = 0; i < hz.length; i++) {
            raw.add(estimate.at(hz[i]));
            if (Math.abs(Math.log(hz[i] / 1000)) < Math.abs(Math.log(hz[ref] / 1000))) {
                ref = i;
            }
        }
        double refDb = raw.get(ref).db();
        List<Point> points = new ArrayList<>();
        for (TransferEstimate.Point p : raw) {
            double model = design == null ? Double.NaN : 10 * Math.log10(design.magnitudeSquared(p.hz()));
            points.add(new Point(p.hz(), p.db(), p.deg(), p.coherence(), p.coherence() >= threshold, model,
                    refDb + target.dbPerOctave() * Math.log(p.hz() / hz[ref]) / Math.log(2)));
        }
        double[] mag2 = estimate.magnitudeSquared();
        mag2[0] = 0; // H at DC is undefined after detrending; no band reaches it (edges > Δf/2 in practice)
        double df = estimate.binWidthHz();
        double nyq = estimate.sampleRateHz() / 2;
        List<BandLevel> levels = new ArrayList<>();
        double[] db = new double[table.size()];
        for (int i = 0; i < table.size(); i++) {
            Band b = table.band(i);
            if (b.lowHz() >= nyq) {
                throw new IllegalArgumentException("band " + b.label() + " (" + b.lowHz() + " … " + b.highHz()
                        + " Hz) lies above the Nyquist frequency " + nyq + " Hz");
            }
            double high = Math.min(b.highHz(), nyq);
            double p = BandIntegral.integrate(mag2, df, b.lowHz(), high);
            db[i] = 10 * Math.log10(p);
            levels.add(new BandLevel(b, p, db[i], Double.NaN, Double.NaN, (high - b.lowHz()) / df,
                    b.highHz() <= nyq));
        }
        NoiseSourceResult.Shape s = NoiseSourceResult.Shape.of(table, db, target, design);
        return new TransferResult(estimate, points, threshold, levels, s.normalizedDb, s.reference, s.slope, target,
                s.deviation, s.designDifference, s.designOffset);
    }
}
