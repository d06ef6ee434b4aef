package org.roseate.tools;

import java.io.IOException;
import java.nio.file.Path;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.BandComparison;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.io.WavFormat;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;
import org.roseate.spectrum.BandLevels;
import org.roseate.spectrum.NoiseSourceResult;
import org.roseate.spectrum.WelchEstimator;
import org.roseate.spectrum.WelchSettings;

/**
 * A measured capture as a comparison column: the same Welch analysis {@code measure} runs in
 * noise-source mode (Hann, 50 % overlap, automatic segment length), band levels in dBFS.
 *
 * @param name   the column header (the file name)
 * @param result the analysis of the capture
 */
public record CaptureColumn(String name, NoiseSourceResult result) implements ComparedColumn {

    /**
     * Analyses one channel of a WAV file.
     *
     * @param channel zero-based channel
     * @throws WavFormatException  for unreadable files, with a one-line message naming the file
     * @throws IllegalArgumentException when the capture is shorter than one analysis segment or the
     *                                  channel does not exist (message names the file)
     */
    public static CaptureColumn of(Path wav, int channel, FrequencyRange range, TargetSlope target,
            BandFraction fraction) throws IOException {
        String name = wav.getFileName().toString();
        BandTable table = BandTable.of(fraction, range.loHz(), range.hiHz());
        try (WavReader reader = WavReader.open(wav)) {
            WavFormat f = reader.format();
            if (channel < 0 || channel >= f.channels()) {
                throw new IllegalArgumentException(name + ": channel " + (channel + 1) + " is out of range; the file has "
                        + f.channels() + (f.channels() == 1 ? " channel" : " channels"));
            }
            int n = BandLevels.autoSegmentLength(f.sampleRateHz(), table);
            if (reader.frames() < n) {
                throw new IllegalArgumentException(String.format(java.util.Locale.ROOT,
                        "%s: the capture is %.2f s, shorter than one %.2f s analysis segment for the %s Hz band",
                        name, reader.frames() / (double) f.sampleRateHz(), n / (double) f.sampleRateHz(), table.band(0).label()));
            }
            WelchEstimator est = new WelchEstimator();
            est.prepare(f.sampleRateHz(), WelchSettings.of(n));
            double[] buf = new double[8192 * f.channels()];
            for (int got; (got = reader.readFrames(buf, 8192)) > 0; ) {
                est.acceptInterleaved(buf, got, f.channels(), channel);
            }
            return new CaptureColumn(name, NoiseSourceResult.of(est.snapshot(), table, target, null));
        }
    }

    @Override
    public BandComparison bands() {
        return result.deviation();
    }

    @Override
    public double slopeDbPerOctave() {
        return result.slopeDbPerOctave();
    }

    /** A capture has band readings only: no pointwise deviation. */
    @Override
    public double maxDeviationDb() {
        return Double.NaN;
    }
}
