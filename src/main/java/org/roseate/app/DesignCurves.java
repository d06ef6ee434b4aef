package org.roseate.app;

import java.util.List;
import org.roseate.compare.BandReading;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.LogGrid;
import org.roseate.model.CircuitModel;

/**
 * The curves the design view draws, from {@link DesignAnalysis} (the same analysis the
 * {@code analyze} command prints). Immutable once built; the arrays are not shared with anyone.
 *
 * @param hz                 response frequencies, Hz ({@link #POINTS_PER_DECADE} per decade over the range)
 * @param responseDb         20·log10|H| at hz, dB
 * @param targetDb           the target line the deviation is measured from (target slope less the
 *                           centring offset), dB
 * @param deviationHz        frequencies of the pointwise deviation, Hz
 * @param deviationDb        response minus target line, centred, dB
 * @param bands              band levels and centred deviations
 * @param slopeDbPerOctave   least-squares slope, dB/octave
 * @param maxDeviationDb     peak pointwise deviation, dB
 * @param maxBandDeviationDb peak band deviation, dB
 */
record DesignCurves(String name, double[] hz, double[] responseDb, double[] targetDb, double[] deviationHz,
        double[] deviationDb, List<BandReading> bands, double slopeDbPerOctave, double maxDeviationDb,
        double maxBandDeviationDb) {
    /** Density of the drawn response: 48 points per decade, smooth at chart size. */
    static final int POINTS_PER_DECADE = 48;
    /** Most points drawn for the deviation; the analysis grid (200 per decade) is thinned to this. */
    static final int MAX_DEVIATION_POINTS = 320;

    static DesignCurves of(CircuitModel model, AnalysisSettings s) {
        double[] hz = LogGrid.points(s.range().loHz(), s.range().hiHz(), POINTS_PER_DECADE);
        DesignAnalysis a = DesignAnalysis.of(model, s.range(), s.target(), s.fraction(), hz);
        double[] db = a.response().db();
        double[] target = new double[hz.length];
        for (int i = 0; i < hz.length; i++) {
            target[i] = s.target().levelDb(hz[i]) - a.slope().offsetDb();
        }
        double[] fitHz = a.slope().hz();
        double[] fitDev = a.slope().deviationDb();
        int step = Math.max(1, (fitHz.length + MAX_DEVIATION_POINTS - 1) / MAX_DEVIATION_POINTS);
        int n = (fitHz.length - 1) / step + 1;
        double[] dHz = new double[n];
        double[] dDb = new double[n];
        for (int i = 0; i < n; i++) {
            dHz[i] = fitHz[i * step];
            dDb[i] = fitDev[i * step];
        }
        return new DesignCurves(model.design().name(), hz, db, target, dHz, dDb, a.bands().readings(),
                a.slope().slopeDbPerOctave(), a.slope().maxDeviationDb(), a.bands().maxBandDeviationDb());
    }
}
