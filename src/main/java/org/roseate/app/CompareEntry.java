package org.roseate.app;

import java.util.List;
import org.roseate.bands.BandTable;
import org.roseate.compare.BandComparison;
import org.roseate.compare.BandReading;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;
import org.roseate.measure.MeasureResult;

/**
 * One column of the comparison: a design's predicted or a capture's measured band levels over the
 * same band table, normalised to the band nearest 1 kHz, with the centred deviation from the
 * target. Immutable.
 *
 * @param name         what the column is called
 * @param kind         "design" or "capture"
 * @param labels       band labels (nominal Hz)
 * @param midHz        exact midband frequencies, Hz
 * @param normalizedDb level minus the reference band's level, dB
 * @param deviationDb  centred deviation from the target, dB
 * @param peakDb       the peak centred deviation, dB
 */
record CompareEntry(String name, String kind, List<String> labels, double[] midHz, double[] normalizedDb,
        double[] deviationDb, double peakDb) {
    CompareEntry {
        labels = List.copyOf(labels);
        midHz = midHz.clone();
        normalizedDb = normalizedDb.clone();
        deviationDb = deviationDb.clone();
    }

    /** A design's band levels ({@link DesignAnalysis#bandLevels}, as {@code analyze} prints them). */
    static CompareEntry ofDesign(String name, CircuitModel model, BandTable table, TargetSlope target) {
        BandComparison c = DesignAnalysis.bandLevels(model, table, target);
        double[] levels = c.readings().stream().mapToDouble(BandReading::levelDb).toArray();
        int ref = referenceIndex(table);
        double[] norm = new double[levels.length];
        for (int i = 0; i < norm.length; i++) {
            norm[i] = levels[i] - levels[ref];
        }
        return new CompareEntry(name, "design", labels(table), table.midHz(), norm,
                c.readings().stream().mapToDouble(BandReading::deviationDb).toArray(), c.maxBandDeviationDb());
    }

    /** A capture's measured levels ({@link MeasureResult}, as {@code measure} prints them). */
    static CompareEntry ofCapture(String name, MeasureResult r, BandTable table) {
        return new CompareEntry(name, "capture", labels(table), table.midHz(),
                r.bands().stream().mapToDouble(org.roseate.measure.BandResult::normalizedDb).toArray(),
                r.bands().stream().mapToDouble(org.roseate.measure.BandResult::deviationDb).toArray(),
                r.maxBandDeviationDb().value());
    }

    /** The band nearest 1 kHz in log frequency: the same reference the measurement results use. */
    static int referenceIndex(BandTable table) {
        int ref = 0;
        for (int i = 0; i < table.size(); i++) {
            if (Math.abs(Math.log(table.band(i).midHz() / 1000)) < Math.abs(Math.log(table.band(ref).midHz() / 1000))) {
                ref = i;
            }
        }
        return ref;
    }

    private static List<String> labels(BandTable table) {
        return table.bands().stream().map(b -> b.label()).toList();
    }
}
