package org.roseate.diagnose;

import java.util.ArrayList;
import java.util.List;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.SpectralDensity;
import org.roseate.spectrum.TransferEstimate;
import org.roseate.spectrum.WelchSettings;
import org.roseate.spectrum.Window;

/**
 * The adapter from today's spectrum results to a {@link MeasuredResponse}: the Welch bins are pooled
 * into cells {@link #POINTS_PER_DECADE} to the decade and each cell gets a standard uncertainty.
 *
 * <p>Random error. Both estimates come from Hann-windowed segments at 50 % overlap
 * ({@link WelchSettings#of}). Averaging K such segments leaves a per-bin relative variance of
 * (1 + 2ρ_t²)/K, ρ_t = 0.167 the overlap correlation of the Hann window at 50 % (Welch 1967, from
 * memory); that is K_eff = K/1.056. Pooling m adjacent bins divides it by
 * m_eff = m / (1 + 2·Σ_{l≥1} (1 − l/m)·ρ_l), where ρ_1 = 4/9 and ρ_2 = 1/36 are the correlations of
 * adjacent and next-adjacent Hann bins' powers (computed from the window's spectral coefficients
 * ½, −¼, −¼). For a noise-source capture the relative error of a cell's power density is then
 * ε = 1/√(K_eff·m_eff), the bandwidth–time product form 1/√(B·T) with B = m_eff·Δf and
 * T = K_eff/Δf. For a transfer capture each bin's relative random error of |H| is
 * ε_k = √(1 − γ_k²)/(|γ_k|·√(2·K_eff)) (Bendat and Piersol, Random Data, 4th ed., sec. 9.2, from
 * memory), and the cell's is √(mean ε_k²/m_eff). In dB, u = 20/ln10·ε for |H| and 10/ln10·ε for
 * a power, each combined in quadrature with {@link #FLOOR_DB}.
 *
 * <p>This class is the only place that knows the spectrum classes; to feed diagnosis from another
 * measurement pipeline, write another adapter producing a {@link MeasuredResponse}.
 */
public final class CaptureResponses {
    /** Analysis points per decade: 24, fine enough that an RC response is linear in log f across a cell. */
    public static final int POINTS_PER_DECADE = 24;
    /** Highest analysed frequency as a fraction of fs: 0.45, below sound cards' anti-alias roll-off (common practice). */
    public static final double HIGH_FRACTION_OF_RATE = 0.45;
    /** Lowest analysed frequency in bins: 2, above the detrended DC bin and its window leakage. */
    public static final int LOW_BINS = 2;
    /**
     * An uncertainty floor, 0.005 dB, combined in quadrature: it keeps weights finite where the
     * random error goes to zero (γ² → 1) and covers the H1 estimate's leakage bias, well below this
     * for RC responses at the resolutions used (common practice).
     */
    public static final double FLOOR_DB = 0.005;
    /** Coherence from which a transfer point is trusted (as {@code measure}). */
    public static final double COHERENCE_THRESHOLD = 0.9;

    private static final double OVERLAP_VARIANCE_FACTOR = 1 + 2 * 0.167 * 0.167;
    private static final double[] HANN_BIN_CORRELATION = {1, 4.0 / 9, 1.0 / 36};
    private static final double DB_PER_NEPER_POWER = 10 / Math.log(10);

    private CaptureResponses() {
    }

    /** The analysed band [lo, hi] in Hz for a capture rate and FFT length. */
    public static double[] band(double sampleRateHz, int segmentLength) {
        return new double[] {LOW_BINS * sampleRateHz / segmentLength,
                Math.min(HIGH_FRACTION_OF_RATE * sampleRateHz, SensitivityBand.GRID_HIGH_HZ)};
    }

    /**
     * A transfer capture's |H| (already calibrated, if at all) as a response with a fixed level.
     *
     * @param loHz low end of the analysed band, Hz
     * @param hiHz high end, Hz
     */
    public static MeasuredResponse fromTransfer(TransferEstimate h, double loHz, double hiHz, String description) {
        double kEff = h.averages() / OVERLAP_VARIANCE_FACTOR;
        double[] f = h.frequenciesHz();
        double[] coh = h.coherence();
        Cells cells = new Cells(loHz, hiHz);
        for (int k = 1; k < f.length; k++) {
            double g = coh[k];
            double mag2 = h.magnitudeSquared(k);
            if (!Double.isFinite(mag2) || !Double.isFinite(g)) {
                continue;
            }
            double gc = Math.max(g, 1e-12);
            double eps2 = (1 - Math.min(gc, 1)) / (gc * 2 * kEff);
            cells.add(f[k], mag2, eps2, g);
        }
        return cells.response(h.sampleRateHz(), 2 * DB_PER_NEPER_POWER, true, false, description);
    }

    /**
     * A noise-source capture's power density as a response with a free level.
     *
     * @param calibration a loopback calibration to divide out, or null
     */
    public static MeasuredResponse fromNoise(SpectralDensity d, double loHz, double hiHz, Calibration calibration,
            String description) {
        if (d.settings().window() != Window.HANN || d.settings().overlapFraction() != 0.5
                || d.settings().averaging() != WelchSettings.Averaging.LINEAR) {
            throw new IllegalArgumentException("the uncertainty model assumes Hann, 50 % overlap, linear averaging");
        }
        double[] density = d.density();
        double[] f = d.frequenciesHz();
        if (calibration != null) {
            double[] one = new double[f.length];
            java.util.Arrays.fill(one, 1);
            TransferEstimate unit = new TransferEstimate(d.sampleRateHz(), d.settings().segmentLength(), f, one,
                    new double[f.length], one, d.averages(), d.effectiveAverages());
            TransferEstimate inv = calibration.apply(unit);
            for (int k = 0; k < f.length; k++) {
                density[k] *= inv.magnitudeSquared(k);
            }
        }
        double kEff = d.effectiveAverages() / OVERLAP_VARIANCE_FACTOR;
        Cells cells = new Cells(loHz, hiHz);
        for (int k = 1; k < f.length; k++) {
            cells.add(f[k], density[k], 1 / kEff, 1);
        }
        return cells.response(d.sampleRateHz(), DB_PER_NEPER_POWER, false, true, description);
    }

    /** m/m_eff for m pooled Hann bins (class description). */
    static double pooledVarianceFactor(int m) {
        double s = 1;
        for (int l = 1; l < Math.min(m, HANN_BIN_CORRELATION.length); l++) {
            s += 2 * (1 - (double) l / m) * HANN_BIN_CORRELATION[l];
        }
        return s;
    }

    /** Accumulates bins into log-spaced cells. */
    private static final class Cells {
        private final double loHz;
        private final double hiHz;
        private final List<double[]> done = new ArrayList<>();
        private int cell = -1;
        private int m;
        private double sumPower;
        private double sumEps2;
        private double sumCoherence;
        private double firstHz;
        private double lastHz;

        Cells(double loHz, double hiHz) {
            this.loHz = loHz;
            this.hiHz = hiHz;
        }

        void add(double hz, double power, double eps2, double coherence) {
            if (hz < loHz * (1 - 1e-12) || hz > hiHz * (1 + 1e-12)) {
                return;
            }
            int c = (int) Math.floor(Math.log10(hz / loHz) * POINTS_PER_DECADE + 1e-9);
            if (c != cell) {
                flush();
                cell = c;
                firstHz = hz;
            }
            m++;
            sumPower += power;
            sumEps2 += eps2;
            sumCoherence += coherence;
            lastHz = hz;
        }

        private void flush() {
            if (m > 0) {
                done.add(new double[] {Math.sqrt(firstHz * lastHz), sumPower / m,
                        sumEps2 / m * pooledVarianceFactor(m) / m, sumCoherence / m});
            }
            m = 0;
            sumPower = 0;
            sumEps2 = 0;
            sumCoherence = 0;
        }

        MeasuredResponse response(double rateHz, double dbPerRelative, boolean checkCoherence, boolean levelFree,
                String description) {
            flush();
            int n = done.size();
            double[] hz = new double[n];
            double[] db = new double[n];
            double[] u = new double[n];
            boolean[] trusted = new boolean[n];
            for (int i = 0; i < n; i++) {
                double[] c = done.get(i);
                hz[i] = c[0];
                db[i] = 10 * Math.log10(c[1]);
                double r = dbPerRelative * Math.sqrt(c[2]);
                u[i] = Math.sqrt(r * r + FLOOR_DB * FLOOR_DB);
                trusted[i] = c[1] > 0 && Double.isFinite(db[i]) && (!checkCoherence || c[3] >= COHERENCE_THRESHOLD);
            }
            return new MeasuredResponse(rateHz, hz, db, u, trusted, levelFree, description);
        }
    }
}
