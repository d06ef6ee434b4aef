package org.roseate.tools;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.BandComparison;
import org.roseate.compare.BandReading;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.measure.BandResult;
import org.roseate.measure.FileMeasure;
import org.roseate.measure.MeasureRequest;
import org.roseate.measure.MeasureResult;

/**
 * A measured capture as a comparison column: exactly the noise-source measurement {@code measure}
 * makes (the same {@link FileMeasure} pipeline), with each band's ± and the ± of its slope and peak.
 *
 * @param name   the column header (the file name)
 * @param result the measurement of the capture
 */
public record CaptureColumn(String name, MeasureResult result) implements ComparedColumn {

    /**
     * Measures one channel of a WAV file.
     *
     * @param channel zero-based channel
     * @throws org.roseate.measure.MeasureException with a one-line message naming the file
     */
    public static CaptureColumn of(Path wav, int channel, FrequencyRange range, TargetSlope target,
            BandFraction fraction) {
        BandTable table = BandTable.of(fraction, range.loHz(), range.hiHz());
        MeasureRequest q = MeasureRequest.noiseSource(table, range, target).withResponseChannel(channel);
        return new CaptureColumn(wav.getFileName().toString(), FileMeasure.run(wav, q));
    }

    @Override
    public BandComparison bands() {
        List<BandReading> rs = new ArrayList<>();
        for (BandResult b : result.bands()) {
            rs.add(new BandReading(b.band(), b.levelDb(), b.deviationDb()));
        }
        return new BandComparison(rs, Double.NaN, result.maxBandDeviationDb().value());
    }

    /** Each band's one-standard-deviation uncertainty, dB (NaN for a tone-dominated band). */
    public double[] uncertaintiesDb() {
        return result.bands().stream().mapToDouble(BandResult::uncertaintyDb).toArray();
    }

    @Override
    public double slopeDbPerOctave() {
        return result.slopeDbPerOctave().value();
    }

    /** A capture has band readings only: no pointwise deviation. */
    @Override
    public double maxDeviationDb() {
        return Double.NaN;
    }
}
