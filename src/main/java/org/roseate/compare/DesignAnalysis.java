package org.roseate.compare;

import java.util.List;
import org.roseate.bands.Band;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.model.BandPower;
import org.roseate.model.CircuitModel;
import org.roseate.model.FrequencyResponse;
import org.roseate.model.Root;

/**
 * Everything {@code analyze} reports about a design against a target slope over a range.
 *
 * @param response         the exact response at the requested points
 * @param slope            pointwise deviation, its peak and the least-squares slope
 * @param bands            band levels (power of unit-density white noise, 10·log10 ∫|H|² df)
 *                         and their centred deviations
 * @param poles            poles, one per real pole or complex pair
 * @param zeros            zeros, likewise
 */
public record DesignAnalysis(String name, FrequencyRange range, TargetSlope target, BandFraction fraction,
        FrequencyResponse response, SlopeFit slope, BandComparison bands, List<Root> poles, List<Root> zeros) {

    /**
     * @param responseHz frequencies for the response points, Hz
     */
    public static DesignAnalysis of(CircuitModel model, FrequencyRange range, TargetSlope target,
            BandFraction fraction, double[] responseHz) {
        FrequencyResponse response = model.response(responseHz);
        SlopeFit slope = SlopeFit.of(hz -> 10 * Math.log10(model.magnitudeSquared(hz)), range, target);
        BandTable table = BandTable.of(fraction, range.loHz(), range.hiHz());
        return new DesignAnalysis(model.design().name(), range, target, fraction, response, slope,
                bandLevels(model, table, target), model.poles(), model.zeros());
    }

    /**
     * As {@link #of}, judging the shape of what comes out of the design driven by a source whose
     * density has the relative shape {@code sourceShape(f)} (dimensionless, &gt; 0; e.g.
     * 1 + fc/f for a junction source with a 1/f corner): power |H(f)|²·shape(f), response
     * magnitude |H|·√shape with H's phase.
     */
    public static DesignAnalysis withSource(CircuitModel model, FrequencyRange range, TargetSlope target,
            BandFraction fraction, double[] responseHz, java.util.function.DoubleUnaryOperator sourceShape) {
        FrequencyResponse h = model.response(responseHz);
        double[] re = h.re().clone();
        double[] im = h.im().clone();
        for (int i = 0; i < re.length; i++) {
            double g = Math.sqrt(sourceShape.applyAsDouble(responseHz[i]));
            re[i] *= g;
            im[i] *= g;
        }
        java.util.function.DoubleUnaryOperator power = hz -> model.magnitudeSquared(hz) * sourceShape.applyAsDouble(hz);
        SlopeFit slope = SlopeFit.of(hz -> 10 * Math.log10(power.applyAsDouble(hz)), range, target);
        BandTable table = BandTable.of(fraction, range.loHz(), range.hiHz());
        List<Band> bands = table.bands();
        double[] levels = new double[bands.size()];
        for (int i = 0; i < levels.length; i++) {
            levels[i] = BandPower.levelDb(power, bands.get(i).lowHz(), bands.get(i).highHz());
        }
        return new DesignAnalysis(model.design().name(), range, target, fraction, new FrequencyResponse(responseHz.clone(), re, im),
                slope, BandComparison.of(table, levels, target), model.poles(), model.zeros());
    }

    /** Model band levels: 10·log10 ∫|H(f)|² df over each band. */
    public static BandComparison bandLevels(CircuitModel model, BandTable table, TargetSlope target) {
        List<Band> bands = table.bands();
        double[] levels = new double[bands.size()];
        for (int i = 0; i < levels.length; i++) {
            levels[i] = BandPower.levelDb(model::magnitudeSquared, bands.get(i).lowHz(), bands.get(i).highHz());
        }
        return BandComparison.of(table, levels, target);
    }
}
