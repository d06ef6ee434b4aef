package org.roseate.spectrum;

import org.roseate.digital.HalfbandDecimator;
import org.roseate.model.Complex;

/**
 * Doubles the sample rate: zeros between the samples, then a half-band low-pass at the doubled rate
 * (the taps of {@link HalfbandDecimator}, times 2 to keep the amplitude). With taps h of length 4K + 1
 * (centre h[2K] = 1/2, the other even taps zero) the two output phases per input x[m] are
 * y[2m] = x[m − K] and y[2m + 1] = 2·Σ_{j=0}^{2K−1} h[2j + 1]·x[m − j] (polyphase form of zero-stuffing and
 * filtering; e.g. Crochiere &amp; Rabiner, Multirate Digital Signal Processing, 1983, from memory).
 *
 * <p>A tone at f (below half the input rate fs) comes out as two lines at the doubled rate: f with
 * amplitude |H(f)| and its image fs − f with amplitude |H(fs − f)|. Allocation-free after construction;
 * one thread at a time; processing in blocks of any sizes gives bitwise the same output.
 */
final class HalfbandInterpolator {
    /** Stopband rejection of the half-band, dB: images of in-band tones stay 100 dB down. */
    static final double REJECTION_DB = 100;
    /** Passband ripple of the half-band, dB. */
    static final double RIPPLE_DB = 0.005;

    private final HalfbandDecimator design;
    private final int k;
    private final double[] oddTaps;
    private final int len;
    private final double[] line;
    private int write;

    /**
     * @param inputRateHz    input rate fs, Hz
     * @param passbandEdgeHz highest frequency to keep flat (±{@value #RIPPLE_DB} dB), below fs/2
     */
    HalfbandInterpolator(double inputRateHz, double passbandEdgeHz) {
        design = HalfbandDecimator.design(2 * inputRateHz, passbandEdgeHz, REJECTION_DB, RIPPLE_DB);
        k = design.halfLength();
        double[] h = design.taps();
        oddTaps = new double[2 * k];
        for (int j = 0; j < 2 * k; j++) {
            oddTaps[j] = 2 * h[2 * j + 1];
        }
        len = 2 * k;
        line = new double[2 * len];
    }

    /** Response of the half-band at a frequency of the doubled rate, DC gain 1 (delay included). */
    Complex response(double hz) {
        return design.response(hz);
    }

    /** Reads n input samples from in[off..] and writes 2n samples to out[0..2n). */
    void process(double[] in, int off, int n, double[] out) {
        double[] d = line;
        int w = write;
        int o = 0;
        for (int i = 0; i < n; i++) {
            double x = in[off + i];
            d[w] = x;
            d[w + len] = x;
            int base = w + len;
            // x[m − j] sits at base − j; x[m − K] at base − K.
            out[o++] = d[base - k];
            double acc = 0;
            for (int j = 0; j < len; j++) {
                acc += oddTaps[j] * d[base - j];
            }
            out[o++] = acc;
            w = (w + 1 == len) ? 0 : w + 1;
        }
        write = w;
    }

    void reset() {
        java.util.Arrays.fill(line, 0);
        write = 0;
    }
}
