package org.roseate.diagnose;

import java.util.ArrayList;
import java.util.List;
import org.roseate.circuit.Design;

/**
 * Where in frequency one part shapes the design's response: the span of frequencies at which
 * |∂(20·log10|H|)/∂ln(value)| is at least half its peak over {@link #GRID_LOW_HZ} …
 * {@link #GRID_HIGH_HZ}. A capture judges a part only if its analysed band overlaps that span;
 * half the peak as the edge is common practice (the −6 dB width of the part's influence).
 *
 * @param designator reference designator
 * @param fromHz     lowest frequency of the span, Hz
 * @param toHz       highest frequency of the span, Hz
 * @param peakDb     the peak sensitivity, dB per unit of ln(value) (8.69 dB for a part the
 *                   response is proportional to)
 */
public record SensitivityBand(String designator, double fromHz, double toHz, double peakDb) {
    /** Low end of the search grid, Hz: below every sub-audio design this project handles. */
    public static final double GRID_LOW_HZ = 0.01;
    /** High end of the search grid, Hz: above audio, below where op-amp gain-bandwidth dominates. */
    public static final double GRID_HIGH_HZ = 100_000;
    private static final int GRID_PER_DECADE = 20;

    /** True when [loHz, hiHz] overlaps this part's span. */
    public boolean seenWithin(double loHz, double hiHz) {
        return loHz <= toHz && hiHz >= fromHz;
    }

    /** The span of every part of the design at its nominal values (priors give the parts). */
    public static List<SensitivityBand> of(Design design, String source, List<PartPrior> parts) {
        int decades = (int) Math.round(Math.log10(GRID_HIGH_HZ / GRID_LOW_HZ));
        int count = decades * GRID_PER_DECADE + 1;
        double[] hz = new double[count];
        for (int i = 0; i < count; i++) {
            hz[i] = GRID_LOW_HZ * Math.pow(10, (double) i / GRID_PER_DECADE);
        }
        LogMagnitudeModel model = new LogMagnitudeModel(design, source, parts, hz);
        double[] db = new double[count];
        double[][] jac = new double[count][parts.size()];
        model.dbAndJacobian(new double[parts.size()], db, jac);
        List<SensitivityBand> out = new ArrayList<>();
        for (int j = 0; j < parts.size(); j++) {
            double peak = 0;
            for (int i = 0; i < count; i++) {
                peak = Math.max(peak, Math.abs(jac[i][j]));
            }
            double from = Double.NaN;
            double to = Double.NaN;
            for (int i = 0; i < count; i++) {
                if (Math.abs(jac[i][j]) >= peak / 2) {
                    if (Double.isNaN(from)) {
                        from = hz[i];
                    }
                    to = hz[i];
                }
            }
            out.add(new SensitivityBand(parts.get(j).designator(), from, to, peak));
        }
        return out;
    }
}
