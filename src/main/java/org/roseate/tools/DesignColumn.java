package org.roseate.tools;

import java.util.Objects;
import org.roseate.compare.BandComparison;
import org.roseate.compare.DesignAnalysis;

/** A design's exact model as a comparison column. */
public record DesignColumn(String name, DesignAnalysis analysis) implements ComparedColumn {
    public DesignColumn {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(analysis, "analysis");
    }

    @Override
    public BandComparison bands() {
        return analysis.bands();
    }

    @Override
    public double slopeDbPerOctave() {
        return analysis.slope().slopeDbPerOctave();
    }

    @Override
    public double maxDeviationDb() {
        return analysis.slope().maxDeviationDb();
    }
}
