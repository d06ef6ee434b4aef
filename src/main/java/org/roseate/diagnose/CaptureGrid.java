package org.roseate.diagnose;

import java.util.ArrayList;
import java.util.List;

/**
 * Where a capture is judged: the analysed band for a capture rate and FFT length, and the analysis
 * points within it that a diagnosis asks the measurement core for.
 */
public final class CaptureGrid {
    /** Analysis points per decade: 24, fine enough that an RC response is nearly linear in log f across a point's cell. */
    public static final int POINTS_PER_DECADE = 24;
    /** Highest analysed frequency as a fraction of fs: 0.45, below sound cards' anti-alias roll-off (common practice). */
    public static final double HIGH_FRACTION_OF_RATE = 0.45;
    /** Lowest analysed frequency in bins: 2, above the detrended DC bin and its window leakage. */
    public static final int LOW_BINS = 2;
    /**
     * Least spacing of two analysis points, FFT bins: 2. Hann bins two apart have power correlation
     * 1/36 (from the window's coefficients ½, −¼, −¼), so points this far apart carry nearly
     * independent errors and the fit's weights stay honest.
     */
    public static final double MIN_SPACING_BINS = 2;

    private CaptureGrid() {
    }

    /** The analysed band [lo, hi] in Hz for a capture rate and FFT length. */
    public static double[] band(double sampleRateHz, int segmentLength) {
        return new double[] {LOW_BINS * sampleRateHz / segmentLength,
                Math.min(HIGH_FRACTION_OF_RATE * sampleRateHz, SensitivityBand.GRID_HIGH_HZ)};
    }

    /**
     * The analysis points over {@link #band}: a log grid of {@link #POINTS_PER_DECADE} per decade from
     * the band's low end, each moved to the nearest FFT bin (so a transfer point is one bin's estimate,
     * not an interpolation between two), thinned so that no two points lie closer than
     * {@link #MIN_SPACING_BINS} bins; ascending, Hz.
     */
    public static double[] points(double sampleRateHz, int segmentLength) {
        double[] b = band(sampleRateHz, segmentLength);
        double df = sampleRateHz / segmentLength;
        List<Double> out = new ArrayList<>();
        double step = Math.pow(10, 1.0 / POINTS_PER_DECADE);
        double last = Double.NEGATIVE_INFINITY;
        for (int i = 0; ; i++) {
            double g = b[0] * Math.pow(step, i);
            if (g > b[1] * (1 + 1e-12)) {
                break;
            }
            double f = Math.min(Math.rint(g / df), Math.floor(b[1] / df + 1e-9)) * df;
            if (f - last >= MIN_SPACING_BINS * df * (1 - 1e-9)) {
                out.add(f);
                last = f;
            }
        }
        return out.stream().mapToDouble(Double::doubleValue).toArray();
    }
}
