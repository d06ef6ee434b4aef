package org.roseate.spectrum;

import java.util.Objects;

/**
 * A one-sided power spectral density from Welch averaging, as scipy.signal.welch with
 * scaling='density': bins k = 0 … n/2 at k·fs/n Hz; Σ_k density[k]·Δf equals the mean square of
 * the detrended, window-weighted segments (Parseval). Immutable: the arrays are copied in and out.
 *
 * @param sampleRateHz             fs, Hz
 * @param settings                 how the estimate was made
 * @param frequenciesHz            bin frequencies k·fs/n, Hz
 * @param density                  density per bin, in {@code unit}
 * @param averages                 segments averaged (0 if none yet; then density is all zero)
 * @param effectiveAverages        1/Σa_s², equal to averages for linear averaging, fewer for
 *                                 exponential (about 2τ − 1 in the steady state)
 * @param effectiveDurationSeconds T_eff, the record length that sets the random error of a band
 *                                 power: ε = 1/√(B·T_eff) (see {@link BandLevels})
 * @param unit                     FS²/Hz, or V²/Hz after {@link #inVolts}
 */
public record SpectralDensity(double sampleRateHz, WelchSettings settings, double[] frequenciesHz, double[] density,
        long averages, double effectiveAverages, double effectiveDurationSeconds, DensityUnit unit) {
    /**
     * @throws IllegalArgumentException if the arrays do not have settings.bins() entries
     */
    public SpectralDensity {
        Objects.requireNonNull(settings, "settings");
        Objects.requireNonNull(unit, "unit");
        frequenciesHz = frequenciesHz.clone();
        density = density.clone();
        if (frequenciesHz.length != settings.bins() || density.length != settings.bins()) {
            throw new IllegalArgumentException(frequenciesHz.length + " frequencies and " + density.length
                    + " densities for " + settings.bins() + " bins");
        }
    }

    @Override
    public double[] frequenciesHz() {
        return frequenciesHz.clone();
    }

    @Override
    public double[] density() {
        return density.clone();
    }

    /** Number of bins, n/2 + 1. */
    public int size() {
        return density.length;
    }

    /** Density of bin k, in {@link #unit()}. */
    public double densityAt(int k) {
        return density[k];
    }

    /** Bin spacing fs/n, Hz. */
    public double binWidthHz() {
        return sampleRateHz / settings.segmentLength();
    }

    /** Nyquist frequency fs/2, Hz. */
    public double nyquistHz() {
        return sampleRateHz / 2;
    }

    /** Σ_k density[k]·Δf: the total power (mean square), in the unit times Hz. */
    public double totalPower() {
        double s = 0;
        for (double d : density) {
            s += d;
        }
        return s * binWidthHz();
    }

    /**
     * The same density in V²/Hz, for an input where full scale is {@code voltsPerFullScale} volts
     * peak: density · V².
     *
     * @param voltsPerFullScale finite, &gt; 0
     * @throws IllegalArgumentException if the value is not finite and positive, or this density is
     *                                  already in volts
     */
    public SpectralDensity inVolts(double voltsPerFullScale) {
        if (!(voltsPerFullScale > 0) || !Double.isFinite(voltsPerFullScale)) {
            throw new IllegalArgumentException("voltsPerFullScale=" + voltsPerFullScale + " must be finite and > 0");
        }
        if (unit == DensityUnit.VOLTS_SQUARED_PER_HZ) {
            throw new IllegalArgumentException("density is already in V²/Hz");
        }
        double[] d = density.clone();
        double v2 = voltsPerFullScale * voltsPerFullScale;
        for (int k = 0; k < d.length; k++) {
            d[k] *= v2;
        }
        return new SpectralDensity(sampleRateHz, settings, frequenciesHz, d, averages, effectiveAverages,
                effectiveDurationSeconds, DensityUnit.VOLTS_SQUARED_PER_HZ);
    }
}
