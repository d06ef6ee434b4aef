package org.roseate.budget;

import java.util.List;
import org.roseate.circuit.SourceNoise;

/**
 * The source model S(f) = d²·(1 + fc/f) fitted to a measured density of the bare source, so a builder
 * can budget, analyse and render the junction they actually have.
 *
 * <p><b>Method.</b> Each measured band (lo, hi) holds the power P = ∫ S df = a·(hi − lo) + b·ln(hi/lo)
 * with a = d² and b = d²·fc, linear in (a, b). Weighted least squares on the band powers, each weighted
 * by 1/(P·ε)² with ε its relative standard deviation (from the measurement's ± in dB:
 * ε = (ln 10/10)·σ_dB), gives (a, b) and their covariance (AᵀWA)⁻¹, scaled up by χ²/(n − 2) when the
 * scatter is larger than the stated ± (a source that does not follow the model). Then d = √a with
 * σ_d = σ_a/(2√a), fc = b/a with σ_fc² = fc²·(σ_a²/a² + σ_b²/b² − 2·cov_ab/(a·b)) (first-order
 * propagation). A negative b (no 1/f rise within the bands) is reported as fc = 0 with its ± from
 * σ_b/a.
 */
public final class SourceFit {
    private SourceFit() {
    }

    /**
     * One measured band of the bare source.
     *
     * @param lowHz            lower edge, Hz
     * @param highHz           upper edge, Hz
     * @param powerV2          the band's power ∫S df, V²
     * @param relativeSigma    one standard deviation of powerV2, relative (&gt; 0)
     */
    public record Band(double lowHz, double highHz, double powerV2, double relativeSigma) {
        public Band {
            if (!(lowHz > 0) || !(highHz > lowHz) || !(powerV2 > 0) || !(relativeSigma > 0)) {
                throw new IllegalArgumentException("band " + lowHz + "-" + highHz + " Hz, power " + powerV2 + " V², ε "
                        + relativeSigma + ": expected 0 < low < high, power > 0, ε > 0");
            }
        }
    }

    /**
     * The fitted source.
     *
     * @param densityVPerRtHz d, V/√Hz
     * @param densitySigma    one standard deviation of d, V/√Hz
     * @param flickerCornerHz fc, Hz (≥ 0)
     * @param cornerSigmaHz   one standard deviation of fc, Hz
     * @param bands           bands used
     * @param chiSquarePerDof χ²/(n − 2) of the fit (about 1 when the model holds)
     */
    public record Result(double densityVPerRtHz, double densitySigma, double flickerCornerHz, double cornerSigmaHz,
            int bands, double chiSquarePerDof) {
        /** The fitted source as a design's {@code source}. */
        public SourceNoise source() {
            return new SourceNoise(densityVPerRtHz, flickerCornerHz);
        }
    }

    /**
     * Fits d and fc.
     *
     * @param bands at least three bands
     * @throws IllegalArgumentException with fewer than three bands, or when the bands cannot separate the
     *         white part from the 1/f part (a singular fit), or when the white part comes out ≤ 0
     */
    public static Result fit(List<Band> bands) {
        if (bands.size() < 3) {
            throw new IllegalArgumentException("only " + bands.size() + " usable band" + (bands.size() == 1 ? "" : "s")
                    + "; the fit needs at least 3");
        }
        double saa = 0;
        double sab = 0;
        double sbb = 0;
        double sya = 0;
        double syb = 0;
        for (Band b : bands) {
            double x1 = b.highHz() - b.lowHz();
            double x2 = Math.log(b.highHz() / b.lowHz());
            double sd = b.powerV2() * b.relativeSigma();
            double w = 1 / (sd * sd);
            saa += w * x1 * x1;
            sab += w * x1 * x2;
            sbb += w * x2 * x2;
            sya += w * x1 * b.powerV2();
            syb += w * x2 * b.powerV2();
        }
        double det = saa * sbb - sab * sab;
        if (!(det > 1e-12 * saa * sbb)) {
            throw new IllegalArgumentException("the bands cannot tell the white part from the 1/f part; measure a wider range");
        }
        double a = (sbb * sya - sab * syb) / det;
        double b = (saa * syb - sab * sya) / det;
        double vaa = sbb / det;
        double vbb = saa / det;
        double vab = -sab / det;
        double chi2 = 0;
        for (Band band : bands) {
            double model = a * (band.highHz() - band.lowHz()) + b * Math.log(band.highHz() / band.lowHz());
            double r = (band.powerV2() - model) / (band.powerV2() * band.relativeSigma());
            chi2 += r * r;
        }
        double perDof = bands.size() > 2 ? chi2 / (bands.size() - 2) : Double.NaN;
        double inflate = Math.max(1, perDof);
        vaa *= inflate;
        vbb *= inflate;
        vab *= inflate;
        if (!(a > 0)) {
            throw new IllegalArgumentException("the fitted white density is not positive; the capture does not look like a"
                    + " noise source with a white part (check --volts-per-fs and the channel)");
        }
        double d = Math.sqrt(a);
        double dSigma = Math.sqrt(vaa) / (2 * d);
        double fc;
        double fcSigma;
        if (b > 0) {
            fc = b / a;
            fcSigma = fc * Math.sqrt(Math.max(0, vaa / (a * a) + vbb / (b * b) - 2 * vab / (a * b)));
        } else {
            fc = 0;
            fcSigma = Math.sqrt(vbb) / a;
        }
        return new Result(d, dSigma, fc, fcSigma, bands.size(), perDof);
    }
}
