package org.roseate.measure;

import java.util.ArrayList;
import java.util.List;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;
import org.roseate.compare.Centering;
import org.roseate.compare.LogGrid;
import org.roseate.compare.TargetSlope;
import org.roseate.model.BandPower;
import org.roseate.model.CircuitModel;
import org.roseate.spectrum.BandIntegral;
import org.roseate.spectrum.BandLevel;
import org.roseate.spectrum.BandLevels;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.CrossSpectralDensity;
import org.roseate.spectrum.SpectralDensity;
import org.roseate.spectrum.TransferEstimate;

/**
 * Turns estimator snapshots into a {@link MeasureResult}: band levels, calibration, tone and
 * coherence marks, and the derived figures with their uncertainty. Stateless; used only by
 * {@link MeasurePipeline}.
 */
final class MeasureAnalysis {
    static final String NOISE_LEGEND = "Band level: the Welch density (Hann, 50% overlap) integrated between the "
            + "IEC 61260-1 band edges; a full-scale sine reads 0 dBFS. ±: one standard deviation of the random "
            + "error, 10·log10(1 + 1/√(B·T_eff)) (Bendat & Piersol). Deviation: against the target slope's band "
            + "levels, centred on the inverse-variance weighted mean of the counted bands; peak and slope ± follow "
            + "from the band ±. Marks: ~ tone-dominated (no noise ±), < below the calibration's -1 dB corner, "
            + "(cut) part of the band above Nyquist; marked bands are left out of slope, centring and peak.";
    static final String BANK_LEGEND = "Filter bank: band levels are the mean square of a Butterworth band-pass per "
            + "band (time domain); on noise they read high by the filter's noise bandwidth over the ideal band "
            + "(about +0.2 dB); ± uses that noise bandwidth and the averaged duration.";
    static final String TRANSFER_LEGEND = "Band level: the band's mean power gain 10·log10(∫|H|² df / B), dB re 1, "
            + "with H = Gxy/Gxx (H1); coherence γ² = |Gxy|²/(Gxx·Gyy), averaged over the band. Bands and points with "
            + "γ² below the threshold are untrusted (*): shown, left out of slope, centring and peak. ± of a point: "
            + "ε = √(1−γ²)/(|γ|·√(2·n_d)) (Bendat & Piersol, Random Data, eq. 9.73), shown as 20·log10(1+ε) dB and "
            + "ε rad; deviations centred on the inverse-variance weighted mean.";

    /**
     * Correlation between the periodograms of two Hann segments overlapping by 50 %: 0.167 (Harris,
     * Proc. IEEE 66(1), 1978, Table 1, "overlap correlation", from memory). With K overlapped segments
     * the variance of the average is (1 + 2c²)/K of one segment's, to first order (Welch 1967), so
     * n_d = K/(1 + 2c²) independent averages.
     */
    static final double HANN_HALF_OVERLAP_CORRELATION = 0.167;
    /**
     * Independent pieces of information per FFT bin width in a band: the Hann window's equivalent noise
     * bandwidth is 1.5 bins (Harris 1978, Table 1), so a band B wide holds about B/(1.5·Δf) uncorrelated
     * bins (our approximation for the band ± in transfer mode).
     */
    static final double HANN_ENBW_BINS = 1.5;
    /** The calibration drop that marks its low corner, dB (the issue's −1 dB). */
    static final double CORNER_DROP_DB = 1;

    private MeasureAnalysis() {
    }

    /**
     * ε = √(1 − γ²)/(|γ|·√(2·n_d)): the normalized random error of an |H| estimate from n_d
     * independent averages with coherence γ² (Bendat and Piersol, Random Data, 4th ed., eq. 9.73,
     * from memory). The same ε, in radians, is the standard deviation of the phase (eq. 9.52).
     * Infinite for γ² = 0.
     */
    static double magnitudeRandomError(double coherence, double independentAverages) {
        double g2 = Math.min(1, Math.max(0, coherence));
        if (!(independentAverages > 0)) {
            return Double.NaN;
        }
        return Math.sqrt(1 - g2) / (Math.sqrt(g2) * Math.sqrt(2 * independentAverages));
    }

    /** n_d for {@link #magnitudeRandomError} from the estimator's effective averages. */
    static double independentAverages(double effectiveAverages) {
        return effectiveAverages / (1 + 2 * HANN_HALF_OVERLAP_CORRELATION * HANN_HALF_OVERLAP_CORRELATION);
    }

    /** The density with the calibration's |H|² divided out, bin by bin. */
    static SpectralDensity calibrated(SpectralDensity d, Calibration cal) {
        double[] f = d.frequenciesHz();
        double[] g = cal.magnitudeSquaredAt(f);
        double[] x = d.density();
        for (int k = 0; k < x.length; k++) {
            x[k] /= g[k];
        }
        return new SpectralDensity(d.sampleRateHz(), d.settings(), f, x, d.averages(), d.effectiveAverages(),
                d.effectiveDurationSeconds(), d.unit());
    }

    /** Inputs shared by both modes. */
    record Context(String source, MeasureRequest request, double sampleRateHz, double seconds, boolean complete,
            List<ChannelIntegrity> integrity) {
    }

    /**
     * Noise-source result from a Welch density (always: it also feeds the tone detector) and, for the
     * filter bank, the bank's mean squares.
     *
     * @param bankMeanSquare FS² per band, or null for the Welch reader
     * @param bankNoiseBwHz  each bank filter's noise bandwidth, Hz (with bankMeanSquare)
     * @param bankSeconds    the bank's averaged duration, s
     */
    static MeasureResult noise(Context c, SpectralDensity raw, double[] bankMeanSquare, double[] bankNoiseBwHz,
            double bankSeconds) {
        MeasureRequest r = c.request();
        BandTable table = r.table();
        double volts = r.effectiveVoltsPerFullScale();
        SpectralDensity uncal = Double.isNaN(volts) ? raw : raw.inVolts(volts);
        Calibration cal = r.calibration();
        SpectralDensity d = cal == null ? uncal : calibrated(uncal, cal);
        double corner = cal == null ? Double.NaN : cal.lowCornerHz(CORNER_DROP_DB);
        List<BandLevel> welch = BandLevels.of(d, table);
        double[] density = d.density();
        int n = table.size();
        double[] level = new double[n];
        double[] sigma = new double[n];
        boolean[] tone = new boolean[n];
        for (int i = 0; i < n; i++) {
            BandLevel b = welch.get(i);
            double high = Math.min(b.band().highHz(), d.nyquistHz());
            tone[i] = ToneDetector.toneDominated(density, d.binWidthHz(), b.band().lowHz(), high, b.power());
            if (bankMeanSquare == null) {
                level[i] = b.levelDb();
                sigma[i] = b.uncertaintyDb();
            } else {
                double ms = bankMeanSquare[i] * (Double.isNaN(volts) ? 1 : volts * volts);
                if (cal != null) {
                    // the bank cannot divide per bin: scale each band by the calibrated-to-raw ratio of
                    // the same band in the Welch density (exact for the density's shape)
                    double rawPower = BandIntegral.integrate(uncal.density(), d.binWidthHz(), b.band().lowHz(), high);
                    ms *= rawPower > 0 ? b.power() / rawPower : 1;
                }
                level[i] = d.unit().levelDb(ms);
                double eps = bankSeconds > 0 ? BandLevels.relativeError(bankNoiseBwHz[i], bankSeconds) : Double.NaN;
                sigma[i] = 10 * Math.log10(1 + eps);
            }
            if (tone[i]) {
                sigma[i] = Double.NaN;
            }
        }
        boolean[] counted = new boolean[n];
        boolean[] below = new boolean[n];
        for (int i = 0; i < n; i++) {
            below[i] = table.band(i).lowHz() < corner;
            counted[i] = welch.get(i).complete() && !tone[i] && !below[i] && Double.isFinite(level[i]);
        }
        double[] densityDb = new double[n];
        for (int i = 0; i < n; i++) {
            densityDb[i] = level[i] - 10 * Math.log10(table.band(i).widthHz());
        }
        Figures f = Figures.of(table, level, densityDb, false, sigma, counted, r.target(), designLevels(r.design(), table, false));
        List<BandResult> bands = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            BandLevel b = welch.get(i);
            bands.add(new BandResult(b.band(), level[i], sigma[i], b.bins(), b.complete(), tone[i], Double.NaN, true,
                    below[i], counted[i], f.normalized[i], f.deviation[i], f.designDifference[i]));
        }
        long averages = d.averages();
        double tEff = bankMeanSquare == null ? d.effectiveDurationSeconds() : bankSeconds;
        return new MeasureResult(c.source(), r, c.sampleRateHz(), c.seconds(), c.complete(), c.integrity(),
                d.settings().segmentLength(), d.binWidthHz(), averages, tEff, d.unit().levelSymbol(), bands,
                table.band(f.reference), f.slope, f.peak, f.designOffset, densityPoints(c, d), corner, null);
    }

    /** Transfer result from a cross-spectral density. */
    static MeasureResult transfer(Context c, CrossSpectralDensity csd) {
        MeasureRequest r = c.request();
        BandTable table = r.table();
        TransferEstimate raw = csd.transfer();
        Calibration cal = r.calibration();
        TransferEstimate h = cal == null ? raw : cal.apply(raw);
        double corner = cal == null ? Double.NaN : cal.lowCornerHz(CORNER_DROP_DB);
        double nd = independentAverages(h.effectiveAverages());
        double df = h.binWidthHz();
        double nyq = h.sampleRateHz() / 2;
        double[] mag2 = h.magnitudeSquared();
        double[] coh = h.coherence();
        mag2[0] = 0; // H at DC is undefined after detrending
        coh[0] = 0;
        double[] weightedError = new double[mag2.length];
        for (int k = 1; k < mag2.length; k++) {
            if (!Double.isFinite(mag2[k])) {
                mag2[k] = 0;
            }
            if (!Double.isFinite(coh[k])) {
                coh[k] = 0;
            }
            double e = magnitudeRandomError(coh[k], nd);
            weightedError[k] = Double.isFinite(e) ? mag2[k] * e : Double.POSITIVE_INFINITY;
        }
        int n = table.size();
        double[] level = new double[n];
        double[] sigma = new double[n];
        double[] meanCoh = new double[n];
        double[] bins = new double[n];
        boolean[] complete = new boolean[n];
        boolean[] trusted = new boolean[n];
        boolean[] below = new boolean[n];
        boolean[] counted = new boolean[n];
        for (int i = 0; i < n; i++) {
            Band b = table.band(i);
            if (b.lowHz() >= nyq) {
                throw new MeasureException(c.source() + ": band " + b.label() + " (" + b.lowHz() + " … " + b.highHz()
                        + " Hz) lies above the Nyquist frequency " + nyq + " Hz");
            }
            double high = Math.min(b.highHz(), nyq);
            double width = high - b.lowHz();
            double p = BandIntegral.integrate(mag2, df, b.lowHz(), high);
            level[i] = 10 * Math.log10(p / width);
            meanCoh[i] = BandIntegral.integrate(coh, df, b.lowHz(), high) / width;
            // ε of |H| in the band: power-weighted mean of the bins' ε, over √(independent bins);
            // |H|² then has 2ε
            double eps = BandIntegral.integrate(weightedError, df, b.lowHz(), high) / p
                    / Math.sqrt(Math.max(1, width / (HANN_ENBW_BINS * df)));
            sigma[i] = 10 * Math.log10(1 + 2 * eps);
            bins[i] = width / df;
            complete[i] = b.highHz() <= nyq;
            trusted[i] = meanCoh[i] >= r.coherenceThreshold();
            below[i] = b.lowHz() < corner;
            counted[i] = complete[i] && trusted[i] && !below[i] && Double.isFinite(level[i]) && Double.isFinite(sigma[i]);
        }
        Figures f = Figures.of(table, level, level, true, sigma, counted, r.target(), designLevels(r.design(), table, true));
        List<BandResult> bands = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            bands.add(new BandResult(table.band(i), level[i], sigma[i], bins[i], complete[i], false, meanCoh[i], trusted[i],
                    below[i], counted[i], f.normalized[i], f.deviation[i], f.designDifference[i]));
        }
        return new MeasureResult(c.source(), r, c.sampleRateHz(), c.seconds(), c.complete(), c.integrity(),
                h.segmentLength(), df, h.averages(), Double.NaN, "dB re 1", bands, table.band(f.reference), f.slope,
                f.peak, f.designOffset, points(c, h, nd), corner, raw);
    }

    private static List<ResponsePoint> points(Context c, TransferEstimate h, double nd) {
        MeasureRequest r = c.request();
        double lo = h.binWidthHz();
        double hi = h.sampleRateHz() / 2;
        double[] hz = r.responseHz();
        if (hz == null) {
            hz = LogGrid.points(Math.max(r.range().loHz(), lo), Math.min(r.range().hiHz(), hi),
                    MeasureRequest.RESPONSE_POINTS_PER_DECADE);
        } else {
            for (double p : hz) {
                if (p < lo || p > hi) {
                    throw new MeasureException(String.format(java.util.Locale.ROOT, "response point %s Hz is outside the "
                            + "resolved range %.4g … %.6g Hz (bin width to Nyquist)", plain(p), lo, hi));
                }
            }
        }
        List<TransferEstimate.Point> raw = new ArrayList<>();
        int ref = 0;
        for (int i = 0; i < hz.length; i++) {
            raw.add(h.at(hz[i]));
            if (Math.abs(Math.log(hz[i] / 1000)) < Math.abs(Math.log(hz[ref] / 1000))) {
                ref = i;
            }
        }
        double refDb = raw.get(ref).db();
        TargetSlope t = r.target();
        CircuitModel m = r.design();
        List<ResponsePoint> out = new ArrayList<>();
        for (TransferEstimate.Point p : raw) {
            double eps = magnitudeRandomError(p.coherence(), nd);
            out.add(new ResponsePoint(p.hz(), p.db(), p.deg(), p.coherence(), p.coherence() >= r.coherenceThreshold(),
                    20 * Math.log10(1 + eps), Math.toDegrees(eps),
                    t == null ? Double.NaN : refDb + t.dbPerOctave() * Math.log(p.hz() / hz[ref]) / Math.log(2),
                    m == null ? Double.NaN : 10 * Math.log10(m.magnitudeSquared(p.hz()))));
        }
        return out;
    }

    /**
     * Power correlations of the Hann window's bins 0, 1 and 2 apart for white noise: 1, 4/9, 1/36
     * (from the window's spectral coefficients ½, −¼, −¼: |Σ w_l w_{l+k}|² / (Σ w_l²)²; Harris 1978
     * gives the same window, the arithmetic is ours).
     */
    private static final double[] HANN_BIN_POWER_CORRELATION = {1, 4.0 / 9, 1.0 / 36};

    /**
     * m/m_eff for the mean of m adjacent Hann bins' powers: 1 + 2·Σ_{l≥1} (1 − l/m)·ρ_l, ρ_l the
     * correlations above (the variance of a mean of a stationary sequence, any statistics text).
     */
    static double pooledVarianceFactor(int m) {
        double s = 1;
        for (int l = 1; l < Math.min(m, HANN_BIN_POWER_CORRELATION.length); l++) {
            s += 2 * (1 - (double) l / m) * HANN_BIN_POWER_CORRELATION[l];
        }
        return s;
    }

    /**
     * Noise-source response points, only when the request names them ({@link MeasureRequest#responseHz}):
     * at each point the (calibrated) density averaged over the m = 2h + 1 bins centred on the bin
     * nearest to it, h the largest that keeps them inside the point's cell (between the geometric
     * midpoints to its neighbours; h = 0 gives the nearest bin alone). The point's frequency is the
     * centre bin's, so the mean of a smooth density is its value there to second order. Its relative random error is ε = √(F(m)/(m·n_d)), F = {@link #pooledVarianceFactor},
     * n_d the independent averages (the bandwidth–time form 1/√(B·T), Bendat and Piersol); the point
     * carries 10·log10(1 + ε) dB. No phase or coherence (NaN); every point is trusted.
     */
    private static List<ResponsePoint> densityPoints(Context c, SpectralDensity d) {
        double[] want = c.request().responseHz();
        if (want == null) {
            return List.of();
        }
        double df = d.binWidthHz();
        double nyq = d.nyquistHz();
        for (double p : want) {
            if (p < df || p > nyq) {
                throw new MeasureException(String.format(java.util.Locale.ROOT, "response point %s Hz is outside the "
                        + "resolved range %.4g … %.6g Hz (bin width to Nyquist)", plain(p), df, nyq));
            }
        }
        double[] hz = want.clone();
        java.util.Arrays.sort(hz);
        double[] density = d.density();
        int last = density.length - 1;
        double nd = independentAverages(d.effectiveAverages());
        CircuitModel m = c.request().design();
        List<ResponsePoint> out = new ArrayList<>();
        int n = hz.length;
        double[] edge = new double[n + 1];
        for (int i = 1; i < n; i++) {
            edge[i] = Math.sqrt(hz[i - 1] * hz[i]);
        }
        // the end cells are symmetric about their point in log f (one point alone: its nearest bin)
        edge[0] = n > 1 ? hz[0] * hz[0] / edge[1] : hz[0];
        edge[n] = n > 1 ? hz[n - 1] * hz[n - 1] / edge[n - 1] : hz[0];
        for (int i = 0; i < n; i++) {
            // the bins symmetric about the nearest bin that stay inside the cell, so the mean of a
            // smooth density is its value at the centre bin to second order
            int centre = Math.max(1, Math.min(last, (int) Math.round(hz[i] / df)));
            int half = 0;
            while (centre - half - 1 >= 1 && centre + half + 1 <= last && (centre - half - 1) * df >= edge[i] * (1 - 1e-12)
                    && (centre + half + 1) * df < edge[i + 1] * (1 - 1e-12)) {
                half++;
            }
            int k0 = centre - half;
            int k1 = centre + half;
            double sum = 0;
            for (int k = k0; k <= k1; k++) {
                sum += density[k];
            }
            int bins = k1 - k0 + 1;
            double eps = Math.sqrt(pooledVarianceFactor(bins) / (bins * nd));
            double f = centre * df;
            out.add(new ResponsePoint(f, 10 * Math.log10(sum / bins), Double.NaN, Double.NaN, true,
                    10 * Math.log10(1 + eps), Double.NaN, Double.NaN,
                    m == null ? Double.NaN : 10 * Math.log10(m.magnitudeSquared(f))));
        }
        return out;
    }

    private static String plain(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }

    /** The design's band levels: ∫|H|² df (dB), or per hertz (dB re 1) for gains; null without a design. */
    private static double[] designLevels(CircuitModel m, BandTable table, boolean perHz) {
        if (m == null) {
            return null;
        }
        double[] out = new double[table.size()];
        for (int i = 0; i < out.length; i++) {
            Band b = table.band(i);
            out[i] = BandPower.levelDb(m::magnitudeSquared, b.lowHz(), b.highHz())
                    - (perHz ? 10 * Math.log10(b.widthHz()) : 0);
        }
        return out;
    }

    /** The derived figures over the counted bands. */
    static final class Figures {
        int reference;
        double[] normalized;
        double[] deviation;
        double[] designDifference;
        Estimate slope = Estimate.NONE;
        Estimate peak = Estimate.NONE;
        double designOffset = Double.NaN;

        /**
         * @param level     band levels, dB
         * @param slopeDb   what the slope is fitted to (density or gain per band), dB
         * @param perHz     the levels are per hertz (transfer gains), so the target is too
         * @param sigma     one standard deviation of each level, dB (NaN: unknown)
         * @param counted   the bands that enter slope, centring and peak
         * @param target    or null
         * @param design    the design's levels in the same sense as level, or null
         */
        static Figures of(BandTable table, double[] level, double[] slopeDb, boolean perHz, double[] sigma, boolean[] counted,
                TargetSlope target, double[] design) {
            int n = level.length;
            Figures f = new Figures();
            for (int i = 0; i < n; i++) {
                if (Math.abs(Math.log(table.band(i).midHz() / 1000)) < Math.abs(Math.log(table.band(f.reference).midHz() / 1000))) {
                    f.reference = i;
                }
            }
            f.normalized = new double[n];
            for (int i = 0; i < n; i++) {
                f.normalized[i] = level[i] - level[f.reference];
            }
            f.slope = slope(table, slopeDb, sigma, counted);
            f.deviation = nan(n);
            if (target != null) {
                double[] raw = new double[n];
                for (int i = 0; i < n; i++) {
                    Band b = table.band(i);
                    raw[i] = level[i] - 10 * Math.log10(target.bandPower(b.lowHz(), b.highHz())
                            / (perHz ? b.widthHz() : 1));
                }
                Centering c = Centering.weighted(raw, sigma, counted);
                f.deviation = c.apply(raw);
                if (c.peakIndex() >= 0) {
                    f.peak = new Estimate(c.peakDb(), c.centredSigmaDb(sigma[c.peakIndex()], true));
                }
            }
            f.designDifference = nan(n);
            if (design != null) {
                double[] raw = new double[n];
                for (int i = 0; i < n; i++) {
                    raw[i] = level[i] - design[i];
                }
                Centering c = Centering.weighted(raw, sigma, counted);
                f.designDifference = c.apply(raw);
                f.designOffset = c.peakIndex() >= 0 ? -c.offsetDb() : Double.NaN;
            }
            return f;
        }

        private static double[] nan(int n) {
            double[] a = new double[n];
            java.util.Arrays.fill(a, Double.NaN);
            return a;
        }

        /**
         * Least-squares slope of y against x = log2(midband) over the counted bands, dB/octave, and
         * its standard deviation σ = √(Σ cᵢ²σᵢ²) with cᵢ = (xᵢ − x̄)/Σ(x − x̄)² (the slope is linear in
         * the yᵢ, which are independent; Bevington and Robinson, eq. 6.21, from memory).
         */
        static Estimate slope(BandTable table, double[] y, double[] sigma, boolean[] counted) {
            double sx = 0;
            int m = 0;
            for (int i = 0; i < y.length; i++) {
                if (counted[i]) {
                    sx += log2(table.band(i).midHz());
                    m++;
                }
            }
            if (m < 2) {
                return Estimate.NONE;
            }
            double mx = sx / m;
            double sxx = 0;
            for (int i = 0; i < y.length; i++) {
                if (counted[i]) {
                    double dx = log2(table.band(i).midHz()) - mx;
                    sxx += dx * dx;
                }
            }
            double b = 0;
            double v = 0;
            for (int i = 0; i < y.length; i++) {
                if (counted[i]) {
                    double ci = (log2(table.band(i).midHz()) - mx) / sxx;
                    b += ci * y[i];
                    v += ci * ci * sigma[i] * sigma[i];
                }
            }
            return new Estimate(b, Math.sqrt(v));
        }

        private static double log2(double x) {
            return Math.log(x) / Math.log(2);
        }
    }

}
