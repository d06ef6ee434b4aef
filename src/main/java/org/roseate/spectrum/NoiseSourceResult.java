package org.roseate.spectrum;

import java.util.List;
import java.util.Objects;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;
import org.roseate.compare.BandComparison;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.SlopeFit;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;

/**
 * What a capture of a noise source says about it, band by band.
 *
 * @param density            the Welch density the bands came from
 * @param levels             band levels with uncertainty (dBFS or dBV)
 * @param normalizedDb       each level minus the level of the reference band
 * @param referenceBand      the band the levels are normalised to: the 1 kHz band, or the band
 *                           nearest 1 kHz (in log frequency) when the range excludes it
 * @param slopeDbPerOctave   least-squares slope of the spectral density the bands imply (band level
 *                           minus 10·log10 of the band width) against log2 of the exact midband
 *                           frequency, dB/octave: the same quantity analyze reports for a design,
 *                           so pink noise reads −3.01 and white 0, although pink band levels are flat
 * @param target             the target slope
 * @param deviation          levels against the target's band levels, centred (the same
 *                           comparison analyze makes for a design)
 * @param designDifferenceDb measured level minus the design's predicted band level
 *                           (DesignAnalysis.bandLevels), with the mean difference over the bands
 *                           removed so only the shape is compared; null without a design
 * @param designOffsetDb     that removed mean, dB (NaN without a design)
 */
public record NoiseSourceResult(SpectralDensity density, List<BandLevel> levels, double[] normalizedDb,
        Band referenceBand, double slopeDbPerOctave, TargetSlope target, BandComparison deviation,
        double[] designDifferenceDb, double designOffsetDb) {
    public NoiseSourceResult {
        levels = List.copyOf(levels);
        normalizedDb = normalizedDb.clone();
        designDifferenceDb = designDifferenceDb == null ? null : designDifferenceDb.clone();
    }

    @Override
    public double[] normalizedDb() {
        return normalizedDb.clone();
    }

    @Override
    public double[] designDifferenceDb() {
        return designDifferenceDb == null ? null : designDifferenceDb.clone();
    }

    /**
     * Analyses a density over a band table.
     *
     * @param design the design the source was built from, or null
     * @throws IllegalArgumentException as {@link BandLevels#of}
     */
    public static NoiseSourceResult of(SpectralDensity density, BandTable table, TargetSlope target,
            CircuitModel design) {
        Objects.requireNonNull(target, "target");
        List<BandLevel> levels = BandLevels.of(density, table);
        double[] db = new double[levels.size()];
        for (int i = 0; i < db.length; i++) {
            db[i] = levels.get(i).levelDb();
        }
        Shape s = Shape.of(table, db, target, design);
        return new NoiseSourceResult(density, levels, s.normalizedDb, s.reference, s.slope, target, s.deviation,
                s.designDifference, s.designOffset);
    }

    /** The shape analysis shared by the noise-source and transfer results. */
    static final class Shape {
        Band reference;
        double[] normalizedDb;
        double slope;
        BandComparison deviation;
        double[] designDifference;
        double designOffset = Double.NaN;

        static Shape of(BandTable table, double[] db, TargetSlope target, CircuitModel design) {
            Shape s = new Shape();
            int ref = 0;
            for (int i = 0; i < table.size(); i++) {
                if (Math.abs(Math.log(table.band(i).midHz() / 1000)) < Math.abs(Math.log(table.band(ref).midHz() / 1000))) {
                    ref = i;
                }
            }
            s.reference = table.band(ref);
            s.normalizedDb = new double[db.length];
            for (int i = 0; i < db.length; i++) {
                s.normalizedDb[i] = db[i] - db[ref];
            }
            double[] densityDb = new double[db.length];
            for (int i = 0; i < db.length; i++) {
                densityDb[i] = db[i] - 10 * Math.log10(table.band(i).widthHz());
            }
            s.slope = db.length > 1 ? SlopeFit.leastSquaresSlope(table.midHz(), densityDb) : Double.NaN;
            s.deviation = BandComparison.of(table, db, target);
            if (design != null) {
                BandComparison model = DesignAnalysis.bandLevels(design, table, target);
                double[] diff = new double[db.length];
                double mean = 0;
                for (int i = 0; i < db.length; i++) {
                    diff[i] = db[i] - model.readings().get(i).levelDb();
                    mean += diff[i];
                }
                mean /= db.length;
                for (int i = 0; i < db.length; i++) {
                    diff[i] -= mean;
                }
                s.designDifference = diff;
                s.designOffset = mean;
            }
            return s;
        }
    }
}
