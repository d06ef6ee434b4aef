package org.roseate.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.budget.SourceFit;
import org.roseate.compare.FrequencyRange;
import org.roseate.io.WavReader;
import org.roseate.measure.BandResult;
import org.roseate.measure.FileMeasure;
import org.roseate.measure.MeasureException;
import org.roseate.measure.MeasureRequest;
import org.roseate.measure.MeasureResult;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.CalibrationException;

/**
 * A source read from a capture of the bare source: the measurement core ({@link FileMeasure}, Welch
 * third-octave band powers in volts with their ±) over {@value #FIT_LOW_HZ} Hz to 20 kHz (at most 0.45·fs),
 * then {@link SourceFit}. The capture needs volts: {@code --volts-per-fs}, or a {@code --calibration} that
 * carries volts per full scale (its loopback response is divided out as in {@code measure}).
 */
final class SourceCapture {
    /** Lowest band centre of the fit, Hz: low enough to see a 1/f corner of tens of Hz. */
    static final double FIT_LOW_HZ = 10;
    /** Highest band centre, Hz, or 0.45·fs when lower (clear of the converter's anti-alias roll-off). */
    static final double FIT_HIGH_HZ = 20000;

    /**
     * Shortest capture, s: the 10 Hz band's analysis segment is about 5 s (the measurement core's automatic
     * choice at 48 kHz), and a fit wants several of them averaged.
     */
    static final double MIN_SECONDS = 20;

    private SourceCapture() {
    }

    /** The fitted source; warnings of the measurement (clipping, …) go to {@code err}. */
    static SourceFit.Result fit(Path capture, Double voltsPerFs, Path calibration, PrintWriter err) {
        return fit(capture, voltsPerFs, calibration, err, "--volts-per-fs", "--calibration");
    }

    /** As {@link #fit(Path, Double, Path, PrintWriter)}, naming the volts and calibration options as the command calls them. */
    static SourceFit.Result fit(Path capture, Double voltsPerFs, Path calibration, PrintWriter err, String voltsOption,
            String calibrationOption) {
        if (voltsPerFs != null && !(voltsPerFs > 0 && Double.isFinite(voltsPerFs))) {
            throw new UserInputException(voltsOption + ": expected a positive number of volts, found " + voltsPerFs);
        }
        Calibration cal = null;
        if (calibration != null) {
            try {
                cal = Calibration.read(calibration);
            } catch (CalibrationException e) {
                throw new UserInputException(e.getMessage());
            }
        }
        if (voltsPerFs == null && (cal == null || Double.isNaN(cal.voltsPerFullScale()))) {
            throw new UserInputException("--source-capture needs volts: give " + voltsOption + " V (volts at the capture's full"
                    + " scale) or a " + calibrationOption + " that carries them; the source's density must be in V/√Hz");
        }
        double rate = 48000;
        long frames = -1;
        try (WavReader r = WavReader.open(capture)) {
            rate = r.format().sampleRateHz();
            frames = r.frames();
        } catch (IOException | RuntimeException e) {
            // the measurement below reports an unreadable capture with the project's usual message
        }
        if (frames >= 0 && frames < MIN_SECONDS * rate) {
            throw new UserInputException(Numbers.f("%s: the capture is %.3g s; the source fit reads third-octave bands down to"
                    + " %.0f Hz, which needs at least %.0f s of the bare source (several analysis segments of about 5 s)",
                    capture.getFileName(), frames / rate, FIT_LOW_HZ, MIN_SECONDS));
        }
        double top = Math.min(FIT_HIGH_HZ, 0.45 * rate);
        MeasureResult res;
        try {
            FrequencyRange range = new FrequencyRange(FIT_LOW_HZ, top);
            BandTable table = BandTable.of(BandFraction.THIRD_OCTAVE, range.loHz(), range.hiHz());
            MeasureRequest q = MeasureRequest.noiseSource(table, range, null).withCalibration(cal)
                    .withVoltsPerFullScale(voltsPerFs == null ? Double.NaN : voltsPerFs);
            res = FileMeasure.run(capture, q);
        } catch (MeasureException e) {
            throw new UserInputException(e.getMessage());
        } catch (IllegalArgumentException e) {
            throw new UserInputException(capture.getFileName() + ": " + e.getMessage());
        }
        for (String w : res.warnings()) {
            err.println("roseate: " + w);
        }
        List<SourceFit.Band> bands = new ArrayList<>();
        double nyquist = res.sampleRateHz() / 2;
        for (BandResult b : res.bands()) {
            if (b.counted() && Double.isFinite(b.uncertaintyDb()) && b.uncertaintyDb() > 0) {
                bands.add(new SourceFit.Band(b.band().lowHz(), Math.min(b.band().highHz(), nyquist),
                        Math.pow(10, b.levelDb() / 10), Math.log(10) / 10 * b.uncertaintyDb()));
            }
        }
        try {
            return SourceFit.fit(bands);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(capture.getFileName() + ": cannot fit the source: " + e.getMessage());
        }
    }

    /** One line describing the fit, for tables. */
    static String describe(Path capture, SourceFit.Result f) {
        return Numbers.f("Source: fitted to %s: d = %.4g ± %.2g V/√Hz, 1/f corner %.4g ± %.2g Hz (%d third-octave bands,"
                + " χ²/dof %.2f; ± one standard deviation)", capture.getFileName(), f.densityVPerRtHz(), f.densitySigma(),
                f.flickerCornerHz(), f.cornerSigmaHz(), f.bands(), f.chiSquarePerDof());
    }
}
