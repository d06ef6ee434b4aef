package org.roseate.spectrum;

import java.util.Locale;
import java.util.Optional;

/**
 * Data windows for spectral estimation, all periodic (DFT-even): w[i] = Σ_k (−1)^k a_k ·
 * cos(2πk·i/n) for i = 0 … n−1, which is what scipy.signal.get_window(name, n) returns by
 * default (fftbins=True). Periodic windows are the right kind for Welch averaging, since their
 * shifted copies at 50 % overlap sum to a constant for Hann.
 *
 * <p>Coefficients a_k: Hann {0.5, 0.5}; flat-top {0.21557895, 0.41663158, 0.277263158,
 * 0.083578947, 0.006947368} (D'Antona and Ferrero, Digital Signal Processing for Measurement
 * Systems, 2006, as used by scipy.signal.windows.flattop); 4-term Blackman-Harris {0.35875,
 * 0.48829, 0.14128, 0.01168} (Harris, Proc. IEEE 66(1), 1978, table 1); rectangular {1}.
 */
public enum Window {
    /** Hann (raised cosine), the default: coherent gain 0.5, ENBW 1.5 bins. */
    HANN("hann", 0.5, 0.5),
    /** Flat-top: amplitude of a tone is read to about 0.01 dB wherever it falls between bins. */
    FLAT_TOP("flattop", 0.21557895, 0.41663158, 0.277263158, 0.083578947, 0.006947368),
    /** Minimum 4-term Blackman-Harris: sidelobes below −92 dB. */
    BLACKMAN_HARRIS("blackmanharris", 0.35875, 0.48829, 0.14128, 0.01168),
    /** Rectangular (no window): ENBW 1 bin, for signals periodic in the segment. */
    RECTANGULAR("rectangular", 1.0);

    private final String key;
    private final double[] a;

    Window(String key, double... a) {
        this.key = key;
        this.a = a;
    }

    /** The short name {@link #parse} accepts: "hann", "flattop", "blackmanharris", "rectangular". */
    public String key() {
        return key;
    }

    /**
     * The n periodic window values, a fresh array.
     *
     * @param n segment length, ≥ 1
     * @throws IllegalArgumentException if n &lt; 1
     */
    public double[] coefficients(int n) {
        if (n < 1) {
            throw new IllegalArgumentException("n=" + n + " must be >= 1");
        }
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            double s = 0;
            for (int k = 0; k < a.length; k++) {
                double c = Math.cos(2 * Math.PI * k * (double) i / n);
                s += (k % 2 == 0 ? a[k] : -a[k]) * c;
            }
            w[i] = s;
        }
        return w;
    }

    /** Coherent gain Σw / n: the amplitude a bin-centred tone reads, relative to no window. */
    public double coherentGain(int n) {
        double s = 0;
        for (double v : coefficients(n)) {
            s += v;
        }
        return s / n;
    }

    /**
     * Equivalent noise bandwidth in bins, n·Σw² / (Σw)² (Harris 1978, eq. 11): 1.5 for Hann,
     * 1 for rectangular, about 3.77 for flat-top and 2.00 for Blackman-Harris.
     */
    public double enbwBins(int n) {
        double s = 0;
        double s2 = 0;
        for (double v : coefficients(n)) {
            s += v;
            s2 += v * v;
        }
        return n * s2 / (s * s);
    }

    /** Reads a window name, ignoring case: hann, flattop (flat-top), blackmanharris, rectangular (boxcar). */
    public static Optional<Window> parse(String text) {
        if (text == null) {
            return Optional.empty();
        }
        return switch (text.trim().toLowerCase(Locale.ROOT)) {
            case "hann", "hanning" -> Optional.of(HANN);
            case "flattop", "flat-top" -> Optional.of(FLAT_TOP);
            case "blackmanharris", "blackman-harris" -> Optional.of(BLACKMAN_HARRIS);
            case "rectangular", "boxcar", "none" -> Optional.of(RECTANGULAR);
            default -> Optional.empty();
        };
    }
}
