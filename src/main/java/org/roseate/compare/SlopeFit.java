package org.roseate.compare;

import java.util.function.DoubleUnaryOperator;

/**
 * How a response follows a target slope over a range, on a dense log-frequency grid.
 *
 * @param hz                 the grid, Hz ({@link #POINTS_PER_DECADE} per decade)
 * @param deviationDb        response minus target line at each point, after {@code offsetDb}
 * @param offsetDb           the offset that centres the deviation (max = −min)
 * @param maxDeviationDb     the centred deviation's peak, dB (half the peak-to-peak)
 * @param slopeDbPerOctave   least-squares slope of the response in dB against log2 f
 */
public record SlopeFit(double[] hz, double[] deviationDb, double offsetDb, double maxDeviationDb,
        double slopeDbPerOctave) {
    /** Grid density for deviation and slope: 200 per decade (the brief asks for at least 100). */
    public static final int POINTS_PER_DECADE = 200;

    /**
     * @param responseDb the response level in dB at a frequency in Hz
     */
    public static SlopeFit of(DoubleUnaryOperator responseDb, FrequencyRange range, TargetSlope target) {
        double[] f = LogGrid.points(range.loHz(), range.hiHz(), POINTS_PER_DECADE);
        double[] db = new double[f.length];
        double[] raw = new double[f.length];
        for (int i = 0; i < f.length; i++) {
            db[i] = responseDb.applyAsDouble(f[i]);
            raw[i] = db[i] - target.levelDb(f[i]);
        }
        Centering c = Centering.of(raw);
        return new SlopeFit(f, c.apply(raw), c.offsetDb(), c.peakDb(), leastSquaresSlope(f, db));
    }

    /** Slope of the least-squares line through (log2 f, dB), in dB/octave. */
    public static double leastSquaresSlope(double[] hz, double[] db) {
        int n = hz.length;
        double mx = 0;
        double my = 0;
        for (int i = 0; i < n; i++) {
            mx += Math.log(hz[i]) / Math.log(2);
            my += db[i];
        }
        mx /= n;
        my /= n;
        double sxy = 0;
        double sxx = 0;
        for (int i = 0; i < n; i++) {
            double x = Math.log(hz[i]) / Math.log(2) - mx;
            sxy += x * (db[i] - my);
            sxx += x * x;
        }
        return sxy / sxx;
    }
}
