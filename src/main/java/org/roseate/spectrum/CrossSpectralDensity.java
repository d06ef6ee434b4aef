package org.roseate.spectrum;

import java.util.Objects;

/**
 * Welch auto and cross spectral densities of a reference x and a response y, one-sided, FS²/Hz,
 * as scipy.signal.welch and scipy.signal.csd (Gxy = conj(X)·Y). Immutable; arrays are copied.
 *
 * @param sampleRateHz             fs, Hz
 * @param settings                 how the estimate was made
 * @param frequenciesHz            bin frequencies k·fs/n, Hz
 * @param gxx                      reference density
 * @param gyy                      response density
 * @param gxyRe                    real part of the cross density
 * @param gxyIm                    imaginary part of the cross density
 * @param averages                 segments averaged
 * @param effectiveAverages        1/Σa_s²
 * @param effectiveDurationSeconds T_eff (see {@link SpectralDensity})
 */
public record CrossSpectralDensity(double sampleRateHz, WelchSettings settings, double[] frequenciesHz, double[] gxx,
        double[] gyy, double[] gxyRe, double[] gxyIm, long averages, double effectiveAverages,
        double effectiveDurationSeconds) {
    public CrossSpectralDensity {
        Objects.requireNonNull(settings, "settings");
        frequenciesHz = frequenciesHz.clone();
        gxx = gxx.clone();
        gyy = gyy.clone();
        gxyRe = gxyRe.clone();
        gxyIm = gxyIm.clone();
        int b = settings.bins();
        if (frequenciesHz.length != b || gxx.length != b || gyy.length != b || gxyRe.length != b
                || gxyIm.length != b) {
            throw new IllegalArgumentException("every array must have " + b + " bins");
        }
    }

    @Override
    public double[] frequenciesHz() {
        return frequenciesHz.clone();
    }

    @Override
    public double[] gxx() {
        return gxx.clone();
    }

    @Override
    public double[] gyy() {
        return gyy.clone();
    }

    @Override
    public double[] gxyRe() {
        return gxyRe.clone();
    }

    @Override
    public double[] gxyIm() {
        return gxyIm.clone();
    }

    /** Number of bins, n/2 + 1. */
    public int size() {
        return gxx.length;
    }

    /**
     * Magnitude-squared coherence γ² = |Gxy|² / (Gxx·Gyy) per bin, in [0, 1] (NaN where a density
     * is zero), as scipy.signal.coherence.
     */
    public double[] coherence() {
        double[] c = new double[gxx.length];
        for (int k = 0; k < c.length; k++) {
            c[k] = (gxyRe[k] * gxyRe[k] + gxyIm[k] * gxyIm[k]) / (gxx[k] * gyy[k]);
        }
        return c;
    }

    /** The reference channel's density alone. */
    public SpectralDensity reference() {
        return new SpectralDensity(sampleRateHz, settings, frequenciesHz, gxx, averages, effectiveAverages,
                effectiveDurationSeconds, DensityUnit.FULL_SCALE_SQUARED_PER_HZ);
    }

    /** The response channel's density alone. */
    public SpectralDensity response() {
        return new SpectralDensity(sampleRateHz, settings, frequenciesHz, gyy, averages, effectiveAverages,
                effectiveDurationSeconds, DensityUnit.FULL_SCALE_SQUARED_PER_HZ);
    }

    /** The H1 estimate Gxy/Gxx with its coherence. */
    public TransferEstimate transfer() {
        double[] re = new double[gxx.length];
        double[] im = new double[gxx.length];
        for (int k = 0; k < re.length; k++) {
            re[k] = gxyRe[k] / gxx[k];
            im[k] = gxyIm[k] / gxx[k];
        }
        return new TransferEstimate(sampleRateHz, settings.segmentLength(), frequenciesHz, re, im, coherence(),
                averages, effectiveAverages);
    }
}
