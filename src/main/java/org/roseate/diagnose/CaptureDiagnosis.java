package org.roseate.diagnose;

import java.io.IOException;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.circuit.Design;
import org.roseate.compare.FrequencyRange;
import org.roseate.io.WavFormat;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;
import org.roseate.measure.FileMeasure;
import org.roseate.measure.MeasureException;
import org.roseate.measure.MeasureRequest;
import org.roseate.measure.MeasureResult;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.WelchSettings;
import org.roseate.value.Tolerance;

/**
 * The one diagnose pipeline from a capture file (noise stimulus), used by {@code diagnose} and the
 * window's Diagnose view: choose the channels, check the rate and the length against where each part
 * shapes the response, pick the FFT segment, read the capture through the measurement core
 * ({@link FileMeasure} with the analysis points as response points, so integrity checks, calibration
 * and every ± come from the same pipeline as {@code measure}), refuse a capture with too few trusted
 * points, then {@link Diagnoser#diagnose}.
 *
 * <p>Swept-sine captures are read by the sweep reader instead; {@link #checkRate} and
 * {@link #checkTrusted} are shared with that path.
 *
 * <p>Every refusal is a {@link DiagnosisException} with one line naming the capture.
 */
public final class CaptureDiagnosis {
    /** At least this many segments for an automatic segment length, so scatter estimates are stable. */
    private static final int MIN_SEGMENTS = 16;
    public static final int MIN_SEGMENT = 256;

    /**
     * What to diagnose.
     *
     * @param design           the design as drawn
     * @param source           its name for messages (the design file's name)
     * @param capture          the WAV capture
     * @param referenceChannel the transfer capture's reference channel from 1, or null for a noise-source capture
     * @param channel          the response channel from 1, or null for the default
     * @param tolerances       tolerances over the design's own (kind letter or designator)
     * @param calibration      a loopback calibration to divide out, or null
     * @param segment          the FFT segment length, or null for the automatic choice
     */
    public record Request(Design design, String source, Path capture, Integer referenceChannel, Integer channel,
            Map<String, Tolerance> tolerances, Calibration calibration, Integer segment) {
        public Request {
            tolerances = Map.copyOf(tolerances);
        }
    }

    /**
     * The outcome: the measured response, the diagnosis, the segment length, the analysed band (Hz)
     * and the measurement core's warnings about the samples themselves (clipping).
     */
    public record Outcome(MeasuredResponse measured, Diagnosis diagnosis, int segmentLength, double[] bandHz,
            List<String> warnings) {
        public Outcome {
            warnings = List.copyOf(warnings);
        }
    }

    private CaptureDiagnosis() {
    }

    /**
     * Runs the pipeline. Cancelled (with a {@link java.util.concurrent.CancellationException}) when
     * the calling thread is interrupted while the capture is read.
     *
     * @throws MissingToleranceException when a part has no tolerance
     * @throws DiagnosisException        for a capture that cannot support a diagnosis (one line)
     */
    public static Outcome run(Request req) {
        List<PartPrior> priors = PartPrior.of(req.design(), req.tolerances());
        List<SensitivityBand> bands = SensitivityBand.of(req.design(), req.source(), priors);
        Path file = req.capture();
        WavFormat f;
        long frames;
        try (WavReader reader = open(file)) {
            f = reader.format();
            frames = reader.frames();
        } catch (WavFormatException e) {
            throw new DiagnosisException(e.getMessage());
        } catch (IOException e) {
            throw new DiagnosisException(file.getFileName() + ": cannot read (" + e.getMessage() + ")");
        }
        int[] ch = channels(file, f, req.referenceChannel(), req.channel());
        checkRate(file.toString(), f.sampleRateHz(), bands);
        int n = segmentLength(file, f.sampleRateHz(), frames, bands, req.segment());
        Calibration cal = req.calibration();
        MeasureResult res = measure(file, f.sampleRateHz(), n, ch, cal);
        String what = ch.length == 2
                ? f("transfer from channel %d (reference) to channel %d%s, %d averages", ch[0] + 1, ch[1] + 1,
                        cal != null ? ", calibrated" : "", res.averages())
                : f("noise source on channel %d, level unknown%s, %d averages", ch[0] + 1,
                        cal != null ? ", calibrated" : "", res.averages());
        MeasuredResponse measured = MeasuredResponse.of(res, what);
        checkTrusted(file.getFileName().toString(), measured, false);
        Diagnosis dx;
        try {
            dx = Diagnoser.diagnose(req.design(), req.source(), priors, measured, Diagnoser.DEFAULT_CONFIDENCE);
        } catch (DiagnosisException e) {
            throw new DiagnosisException(file.getFileName() + ": " + e.getMessage());
        }
        List<String> warnings = res.warnings().stream().filter(w -> w.contains("clipped")).toList();
        return new Outcome(measured, dx, n, CaptureGrid.band(f.sampleRateHz(), n), warnings);
    }

    /**
     * The capture read through the measurement core, as {@code measure} reads it: one request with
     * the analysis points as response points.
     */
    private static MeasureResult measure(Path file, double rateHz, int n, int[] ch, Calibration cal) {
        double[] band = CaptureGrid.band(rateHz, n);
        // The core always reads a band table too; diagnose shows none, so any octave table it can
        // resolve will do: from 16 low-end bins (8 or more bins per octave band) up.
        double tableLo = Math.min(band[0] * 16, band[1] / 2);
        try {
            BandTable table = BandTable.of(BandFraction.OCTAVE, tableLo, band[1]);
            FrequencyRange range = new FrequencyRange(band[0], band[1]);
            MeasureRequest q = ch.length == 2
                    ? MeasureRequest.transfer(table, range, null, ch[0], ch[1])
                    : MeasureRequest.noiseSource(table, range, null).withResponseChannel(ch[0]);
            q = q.withCalibration(cal).withSegmentLength(n).withResponseHz(CaptureGrid.points(rateHz, n));
            Thread caller = Thread.currentThread();
            return FileMeasure.run(file, q, p -> { }, caller::isInterrupted, r -> { });
        } catch (MeasureException e) {
            throw new DiagnosisException(e.getMessage());
        } catch (IllegalArgumentException e) {
            throw new DiagnosisException(file.getFileName() + ": " + e.getMessage());
        }
    }

    /**
     * Refuses a capture that has too few trusted points to say anything.
     *
     * @param name  the capture's name for the message
     * @param swept true for a swept-sine capture (trusted: noise below half the signal), false for a
     *              noise stimulus (trusted: coherence at or above the core's threshold)
     */
    public static void checkTrusted(String name, MeasuredResponse m, boolean swept) {
        if (m.trustedCount() < Diagnoser.MIN_TRUSTED_POINTS) {
            throw new DiagnosisException(f("%s: %s at %d of %d points, too low to say anything about the "
                    + "parts; check the wiring, the channels and the test level", name, swept
                    ? "the sweep's noise is above half the signal" : f("coherence is below %.2f",
                            MeasureRequest.DEFAULT_COHERENCE_THRESHOLD), m.size() - m.trustedCount(), m.size()));
        }
    }

    /** Refuses a rate whose analysed band ends below where some part shapes the response. */
    public static void checkRate(String name, double rateHz, List<SensitivityBand> bands) {
        double hi = CaptureGrid.band(rateHz, WelchSettings.MAX_SEGMENT_LENGTH)[1];
        SensitivityBand worst = null;
        for (SensitivityBand b : bands) {
            if (b.fromHz() > hi && (worst == null || b.fromHz() > worst.fromHz())) {
                worst = b;
            }
        }
        if (worst != null) {
            throw new DiagnosisException(f("%s: at %s the analysed band ends at %s, below %s, where %s starts "
                    + "to shape the response; capture at %.0f Hz or faster", name, hz(rateHz), hz(hi),
                    hz(worst.fromHz()), worst.designator(), Math.ceil(worst.fromHz() / CaptureGrid.HIGH_FRACTION_OF_RATE)));
        }
    }

    private static String f(String pattern, Object... args) {
        return String.format(Locale.ROOT, pattern, args);
    }

    /** A frequency for humans: 19.95 Hz, 1.000 kHz. */
    private static String hz(double hz) {
        return hz >= 1000 ? f("%.4g kHz", hz / 1000) : f("%.4g Hz", hz);
    }

    private static WavReader open(Path file) throws IOException {
        if (Files.isDirectory(file)) {
            throw new DiagnosisException(file + ": is a folder, not a WAV file");
        }
        try {
            return WavReader.open(file);
        } catch (NoSuchFileException e) {
            throw new DiagnosisException(file + ": no such file");
        } catch (AccessDeniedException e) {
            throw new DiagnosisException(file + ": permission denied");
        }
    }

    /** {reference, response} for a transfer capture, {channel} for a noise-source capture; zero-based. */
    private static int[] channels(Path file, WavFormat f, Integer referenceChannel, Integer channel) {
        if (referenceChannel == null) {
            if (channel == null && f.channels() > 1) {
                throw new DiagnosisException(file + ": has " + f.channels() + " channels; name the reference with "
                        + "--reference-channel N (transfer capture) or the channel with --channel N (noise-source capture)");
            }
            return new int[] {index(file, channel == null ? 1 : channel, "--channel", f.channels())};
        }
        if (f.channels() < 2) {
            throw new DiagnosisException(file + ": --reference-channel needs two channels; the file has 1");
        }
        int ref = index(file, referenceChannel, "--reference-channel", f.channels());
        int resp;
        if (channel != null) {
            resp = index(file, channel, "--channel", f.channels());
        } else if (f.channels() == 2) {
            resp = 1 - ref;
        } else {
            throw new DiagnosisException(file + ": has " + f.channels() + " channels; name the response with --channel");
        }
        if (resp == ref) {
            throw new DiagnosisException("--channel and --reference-channel are both " + (ref + 1) + "; they must differ");
        }
        return new int[] {ref, resp};
    }

    private static int index(Path file, int oneBased, String option, int channels) {
        if (oneBased < 1 || oneBased > channels) {
            throw new DiagnosisException(file + ": " + option + " " + oneBased + " is out of range; the file has "
                    + channels + (channels == 1 ? " channel" : " channels"));
        }
        return oneBased - 1;
    }

    /**
     * The FFT length: {@code segment}, or the smallest power of two whose analysed band starts at or
     * below half the lowest frequency at which every part still shows, within the capture's length.
     */
    private static int segmentLength(Path file, double rateHz, long frames, List<SensitivityBand> bands, Integer segment) {
        double needLo = bands.stream().mapToDouble(SensitivityBand::toHz).min().orElse(20);
        if (segment != null) {
            if (segment < MIN_SEGMENT || segment > WelchSettings.MAX_SEGMENT_LENGTH || segment % 2 != 0) {
                throw new DiagnosisException("--segment: expected an even number of samples from " + MIN_SEGMENT
                        + " to " + WelchSettings.MAX_SEGMENT_LENGTH + ", found " + segment);
            }
            if (frames < segment) {
                throw new DiagnosisException(f("%s: the capture (%d frames) is shorter than one segment of %d",
                        file, frames, segment));
            }
            return segment;
        }
        int wanted = MIN_SEGMENT;
        while (wanted < WelchSettings.MAX_SEGMENT_LENGTH && CaptureGrid.LOW_BINS * rateHz / wanted > needLo / 2) {
            wanted *= 2;
        }
        int n = wanted;
        while (n > MIN_SEGMENT && (long) n * (MIN_SEGMENTS + 1) / 2 > frames) {
            n /= 2;
        }
        if (CaptureGrid.LOW_BINS * rateHz / n > needLo || (long) n * (MIN_SEGMENTS + 1) / 2 > frames) {
            SensitivityBand b = bands.stream().min((x, y) -> Double.compare(x.toHz(), y.toHz())).orElseThrow();
            throw new DiagnosisException(f("%s: %.2f s is too short to see %s, which shapes the response below %s; "
                    + "record at least %.0f s", file, frames / rateHz, b.designator(), hz(b.toHz()),
                    Math.ceil((double) wanted * (MIN_SEGMENTS + 1) / 2 / rateHz)));
        }
        return n;
    }
}
