package org.roseate.spectrum;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;

/**
 * Fractional-octave band levels of a Welch density, with their statistical uncertainty.
 *
 * <p><b>Level.</b> Band power P = ∫ density df between the IEC 61260-1 band edges
 * ({@link BandIntegral}); level = 10·log10(2·P) dBFS, so a full-scale sine (mean square 1/2) reads
 * 0 dBFS (AES17 convention); in V²/Hz the level is 10·log10(P) dBV.
 *
 * <p><b>Uncertainty.</b> The normalized random error of a band-power estimate of Gaussian noise
 * whose density is smooth across a band of width B is ε = 1/√(B·T_eff) (Bendat and Piersol, Random
 * Data, 4th ed., the mean-square error of band-limited noise ε = 1/√(B·T), sec. 4.6 and 8.2, from
 * memory). T_eff corrects the record length T for the window and the overlap (and exponential
 * forgetting): the average of windowed periodograms weights the signal power in time by
 * W(t) = Σ_s a_s·w²(t − s·hop), and the variance of ∫W·x_B² dt for band-limited noise gives
 * T_eff = (∫W dt)² / ∫W² dt. For Hann at 50 % overlap W ripples as 3/4 + 1/4·cos(4πt/n), so
 * T_eff ≈ 0.947·T for long records, in line with Welch (1967), whose per-bin degrees of freedom
 * for that case are about 1.9 per segment. Reported as ±10·log10(1 + ε) dB, one standard deviation.
 * It holds when the band spans several bins (see {@link #MIN_BINS_PER_BAND}); it does not include
 * calibration or systematic errors.
 */
public final class BandLevels {
    /**
     * Bins the lowest band must span for the automatic segment length: 8. With the Hann main lobe
     * 4 bins wide, at most about 2 bins at each edge are shared with the neighbour band, so tones
     * near an edge spill at most a quarter of a lobe into it, and a smooth density loses at each
     * edge what it gains; the uncertainty formula needs B ≫ Δf, which 8 bins meets (common
     * practice, our choice). It costs nothing in variance: ε depends on B·T, not on the segment
     * length.
     */
    public static final int MIN_BINS_PER_BAND = 8;
    /** Smallest automatic segment length, samples. */
    public static final int MIN_AUTO_SEGMENT = 256;

    private BandLevels() {
    }

    /**
     * The levels of every band of the table.
     *
     * @throws IllegalArgumentException if the density has no averages, or a band lies wholly
     *                                  above the Nyquist frequency
     */
    public static List<BandLevel> of(SpectralDensity d, BandTable table) {
        Objects.requireNonNull(d, "d");
        Objects.requireNonNull(table, "table");
        if (d.averages() == 0) {
            throw new IllegalArgumentException("the density has no averages yet: the capture is shorter than one "
                    + d.settings().segmentLength() + "-sample segment");
        }
        double[] density = d.density();
        double df = d.binWidthHz();
        double nyq = d.nyquistHz();
        List<BandLevel> out = new ArrayList<>();
        for (Band b : table.bands()) {
            if (b.lowHz() >= nyq) {
                throw new IllegalArgumentException("band " + b.label() + " (" + b.lowHz() + " … " + b.highHz()
                        + " Hz) lies above the Nyquist frequency " + nyq + " Hz");
            }
            double high = Math.min(b.highHz(), nyq);
            double p = BandIntegral.integrate(density, df, b.lowHz(), high);
            double eps = relativeError(high - b.lowHz(), d.effectiveDurationSeconds());
            out.add(new BandLevel(b, p, d.unit().levelDb(p), eps, 10 * Math.log10(1 + eps), (high - b.lowHz()) / df,
                    b.highHz() <= nyq));
        }
        return List.copyOf(out);
    }

    /**
     * ε = 1/√(B·T_eff), the normalized random error of a band power (class description).
     *
     * @param bandwidthHz           B, &gt; 0
     * @param effectiveSeconds      T_eff, &gt; 0
     */
    public static double relativeError(double bandwidthHz, double effectiveSeconds) {
        if (!(bandwidthHz > 0) || !(effectiveSeconds > 0)) {
            throw new IllegalArgumentException("bandwidthHz=" + bandwidthHz + ", effectiveSeconds=" + effectiveSeconds
                    + " must both be > 0");
        }
        return 1 / Math.sqrt(bandwidthHz * effectiveSeconds);
    }

    /**
     * The automatic segment length: the smallest power of two n ≥ {@value #MIN_AUTO_SEGMENT} with
     * the lowest band at least {@value #MIN_BINS_PER_BAND} bins wide, i.e. n ≥ 8·fs/B_lowest.
     * At 48 kHz the 20 Hz third-octave band (B = 4.63 Hz) needs n = 131072 (Δf = 0.37 Hz, 2.7 s
     * per segment); the 31.5 Hz octave band (B = 22.3 Hz), n = 32768 (Δf = 1.46 Hz).
     *
     * @param sampleRateHz finite, &gt; 0
     * @throws IllegalArgumentException if the result would exceed {@link WelchSettings#MAX_SEGMENT_LENGTH}
     */
    public static int autoSegmentLength(double sampleRateHz, BandTable table) {
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
        double width = table.band(0).widthHz();
        double needed = MIN_BINS_PER_BAND * sampleRateHz / width;
        int n = MIN_AUTO_SEGMENT;
        while (n < needed) {
            if (n >= WelchSettings.MAX_SEGMENT_LENGTH) {
                throw new IllegalArgumentException("band " + table.band(0).label() + " at " + sampleRateHz
                        + " Hz needs a segment longer than " + WelchSettings.MAX_SEGMENT_LENGTH + " samples");
            }
            n *= 2;
        }
        return n;
    }
}
