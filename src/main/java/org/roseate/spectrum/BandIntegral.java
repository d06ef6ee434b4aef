package org.roseate.spectrum;

/**
 * Exact integration of a binned one-sided density between arbitrary band edges. Bin k stands
 * for a rectangle of width Δf centred on k·Δf, so its share of a band is its density times the
 * length of the overlap of [k·Δf − Δf/2, k·Δf + Δf/2] with [lowHz, highHz]: bins wholly inside
 * count in full, the edge bins in proportion. A density that is constant over the band therefore
 * integrates to exactly density × (highHz − lowHz), and adjacent bands sharing an edge split the
 * bins between them without gap or overlap, so their powers add up to the power of their union.
 */
public final class BandIntegral {
    private BandIntegral() {
    }

    /**
     * ∫ density df from lowHz to highHz under the rectangle rule above; parts of the band beyond
     * the last bin's rectangle (above fs/2 + Δf/2) contribute nothing.
     *
     * @param density    per bin k = 0, 1, …, in any unit per Hz
     * @param binWidthHz Δf, &gt; 0
     * @param lowHz      ≥ 0
     * @param highHz     ≥ lowHz
     * @throws IllegalArgumentException if the bounds are not 0 ≤ lowHz ≤ highHz or Δf ≤ 0
     */
    public static double integrate(double[] density, double binWidthHz, double lowHz, double highHz) {
        if (!(binWidthHz > 0) || !(lowHz >= 0) || !(highHz >= lowHz) || !Double.isFinite(highHz)) {
            throw new IllegalArgumentException("binWidthHz=" + binWidthHz + ", lowHz=" + lowHz + ", highHz=" + highHz
                    + " must satisfy binWidthHz > 0 and 0 <= lowHz <= highHz, finite");
        }
        double lo = lowHz / binWidthHz;
        double hi = highHz / binWidthHz;
        int first = Math.max(0, (int) Math.floor(lo + 0.5));
        int last = Math.min(density.length - 1, (int) Math.floor(hi + 0.5));
        double sum = 0;
        for (int k = first; k <= last; k++) {
            double a = Math.max(lo, k - 0.5);
            double b = Math.min(hi, k + 0.5);
            if (b > a) {
                sum += density[k] * (b - a);
            }
        }
        return sum * binWidthHz;
    }
}
