package org.roseate.measure;

import java.util.Arrays;

/**
 * Decides whether a band of a Welch density is dominated by a tone (a spectral line) rather than by
 * noise. The noise ± of a band, ε = 1/√(B·T), assumes a density that is smooth across the band; a
 * line breaks that assumption, so such a band is marked and gets no noise ±.
 *
 * <p>Rule (our choice, documented in the README): take the band's largest bin k; estimate the local
 * floor as the median density of the bins k−{@value #FLOOR_HALF_WIDTH} … k+{@value #FLOOR_HALF_WIDTH}
 * outside k−{@value #LOBE_EXCLUSION} … k+{@value #LOBE_EXCLUSION} (a median ignores the line and
 * its leakage); the line's power is the excess over that floor in the 5 bins k−2 … k+2 (the Hann
 * window's main lobe is 4 bins wide). The band is tone-dominated when its largest bin stands at least
 * {@value #PEAK_TO_FLOOR} times (13 dB) above the floor and the line holds at least half the band's
 * power. For averaged Gaussian noise a bin exceeds 20 times the median with probability
 * exp(−20·ln 2) ≈ 1e-6 even for one segment (the exponential distribution of a periodogram bin),
 * so noise bands are not marked.
 */
public final class ToneDetector {
    /** Bins either side of the peak whose median is the floor. */
    public static final int FLOOR_HALF_WIDTH = 16;
    /** Bins either side of the peak left out of the floor. */
    public static final int LOBE_EXCLUSION = 3;
    /** Least ratio of the peak bin to the floor. */
    public static final double PEAK_TO_FLOOR = 20;
    /** Least share of the band's power in the line. */
    public static final double LINE_SHARE = 0.5;

    private ToneDetector() {
    }

    /**
     * @param density    one-sided density per bin (any unit), bins k·Δf
     * @param binWidthHz Δf, Hz
     * @param lowHz      the band's lower edge, Hz
     * @param highHz     the band's upper edge (cut at Nyquist), Hz
     * @param bandPower  ∫ density df over the band, in the density's unit times Hz
     */
    public static boolean toneDominated(double[] density, double binWidthHz, double lowHz, double highHz,
            double bandPower) {
        if (!(bandPower > 0)) {
            return false;
        }
        int first = Math.max(1, (int) Math.floor(lowHz / binWidthHz + 0.5));
        int last = Math.min(density.length - 1, (int) Math.floor(highHz / binWidthHz + 0.5));
        if (last < first) {
            return false;
        }
        int k = first;
        for (int j = first + 1; j <= last; j++) {
            if (density[j] > density[k]) {
                k = j;
            }
        }
        double[] around = new double[2 * FLOOR_HALF_WIDTH];
        int m = 0;
        for (int j = k - FLOOR_HALF_WIDTH; j <= k + FLOOR_HALF_WIDTH; j++) {
            if (j >= 1 && j < density.length && Math.abs(j - k) > LOBE_EXCLUSION) {
                around[m++] = density[j];
            }
        }
        if (m == 0) {
            return false;
        }
        Arrays.sort(around, 0, m);
        double floor = m % 2 == 1 ? around[m / 2] : (around[m / 2 - 1] + around[m / 2]) / 2;
        if (!(density[k] >= PEAK_TO_FLOOR * floor)) {
            return false;
        }
        double line = 0;
        for (int j = Math.max(1, k - 2); j <= Math.min(density.length - 1, k + 2); j++) {
            line += Math.max(0, density[j] - floor) * binWidthHz;
        }
        return line >= LINE_SHARE * bandPower;
    }
}
