package org.roseate.diagnose;

import java.io.IOException;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.roseate.circuit.Design;
import org.roseate.io.WavFormat;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.CalibrationException;
import org.roseate.spectrum.CrossSpectrumEstimator;
import org.roseate.spectrum.SpectralDensity;
import org.roseate.spectrum.TransferEstimate;
import org.roseate.spectrum.WelchEstimator;
import org.roseate.spectrum.WelchSettings;
import org.roseate.value.Tolerance;

/**
 * The one diagnose pipeline from a capture file, used by {@code diagnose} and the window's Diagnose
 * view: choose the channels, check the rate and the length against where each part shapes the
 * response, pick the FFT segment, read the capture through Welch (a transfer capture: H1 and
 * coherence; a noise-source capture: the density, level left free), refuse a capture with too few
 * trusted points, then {@link Diagnoser#diagnose}.
 *
 * <p>Every refusal is a {@link DiagnosisException} with one line naming the capture.
 */
public final class CaptureDiagnosis {
    private static final int BLOCK_FRAMES = 8192;
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
     * The outcome: the measured response, the diagnosis, the segment length and the analysed band (Hz).
     */
    public record Outcome(MeasuredResponse measured, Diagnosis diagnosis, int segmentLength, double[] bandHz) {
    }

    private CaptureDiagnosis() {
    }

    /**
     * Runs the pipeline.
     *
     * @throws MissingToleranceException when a part has no tolerance
     * @throws DiagnosisException        for a capture that cannot support a diagnosis (one line)
     */
    public static Outcome run(Request req) {
        List<PartPrior> priors = PartPrior.of(req.design(), req.tolerances());
        List<SensitivityBand> bands = SensitivityBand.of(req.design(), req.source(), priors);
        Path file = req.capture();
        try (WavReader reader = open(file)) {
            WavFormat f = reader.format();
            if (req.calibration() != null) {
                try {
                    req.calibration().checkRate(f.sampleRateHz());
                } catch (CalibrationException e) {
                    throw new DiagnosisException(e.getMessage());
                }
            }
            int[] ch = channels(file, f, req.referenceChannel(), req.channel());
            checkRate(file, f.sampleRateHz(), bands);
            int n = segmentLength(file, f.sampleRateHz(), reader.frames(), bands, req.segment());
            double[] band = CaptureResponses.band(f.sampleRateHz(), n);
            MeasuredResponse measured = ch.length == 2
                    ? transfer(reader, f, n, ch[0], ch[1], req.calibration(), band)
                    : noise(reader, f, n, ch[0], req.calibration(), band);
            if (measured.trustedCount() < Diagnoser.MIN_TRUSTED_POINTS) {
                throw new DiagnosisException(f("%s: coherence is below %.2f at %d of %d points, too low to say "
                        + "anything about the parts; check the wiring, the channels and the test level", file,
                        CaptureResponses.COHERENCE_THRESHOLD, measured.size() - measured.trustedCount(), measured.size()));
            }
            Diagnosis dx;
            try {
                dx = Diagnoser.diagnose(req.design(), req.source(), priors, measured, Diagnoser.DEFAULT_CONFIDENCE);
            } catch (DiagnosisException e) {
                throw new DiagnosisException(file.getFileName() + ": " + e.getMessage());
            }
            return new Outcome(measured, dx, n, band);
        } catch (WavFormatException e) {
            throw new DiagnosisException(e.getMessage());
        } catch (IOException e) {
            throw new DiagnosisException(file.getFileName() + ": cannot read (" + e.getMessage() + ")");
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

    /** Refuses a rate whose analysed band ends below where some part shapes the response. */
    private static void checkRate(Path file, double rateHz, List<SensitivityBand> bands) {
        double hi = CaptureResponses.band(rateHz, WelchSettings.MAX_SEGMENT_LENGTH)[1];
        SensitivityBand worst = null;
        for (SensitivityBand b : bands) {
            if (b.fromHz() > hi && (worst == null || b.fromHz() > worst.fromHz())) {
                worst = b;
            }
        }
        if (worst != null) {
            throw new DiagnosisException(f("%s: at %s the analysed band ends at %s, below %s, where %s starts "
                    + "to shape the response; capture at %.0f Hz or faster", file, hz(rateHz), hz(hi),
                    hz(worst.fromHz()), worst.designator(), Math.ceil(worst.fromHz() / CaptureResponses.HIGH_FRACTION_OF_RATE)));
        }
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
        while (wanted < WelchSettings.MAX_SEGMENT_LENGTH
                && CaptureResponses.LOW_BINS * rateHz / wanted > needLo / 2) {
            wanted *= 2;
        }
        int n = wanted;
        while (n > MIN_SEGMENT && (long) n * (MIN_SEGMENTS + 1) / 2 > frames) {
            n /= 2;
        }
        if (CaptureResponses.LOW_BINS * rateHz / n > needLo || (long) n * (MIN_SEGMENTS + 1) / 2 > frames) {
            SensitivityBand b = bands.stream().min((x, y) -> Double.compare(x.toHz(), y.toHz())).orElseThrow();
            throw new DiagnosisException(f("%s: %.2f s is too short to see %s, which shapes the response below %s; "
                    + "record at least %.0f s", file, frames / rateHz, b.designator(), hz(b.toHz()),
                    Math.ceil((double) wanted * (MIN_SEGMENTS + 1) / 2 / rateHz)));
        }
        return n;
    }

    private static MeasuredResponse transfer(WavReader reader, WavFormat f, int n, int ref, int resp, Calibration cal,
            double[] band) throws IOException {
        CrossSpectrumEstimator est = new CrossSpectrumEstimator();
        est.prepare(f.sampleRateHz(), WelchSettings.of(n));
        double[] buf = new double[BLOCK_FRAMES * f.channels()];
        for (int got; (got = reader.readFrames(buf, BLOCK_FRAMES)) > 0; ) {
            if (Thread.currentThread().isInterrupted()) {
                throw new DiagnosisException("diagnose: cancelled");
            }
            est.acceptInterleaved(buf, got, f.channels(), ref, resp);
        }
        TransferEstimate h = est.snapshot().transfer();
        if (cal != null) {
            h = cal.apply(h);
        }
        return CaptureResponses.fromTransfer(h, band[0], band[1], f("transfer from channel %d (reference) to "
                + "channel %d%s, %d averages", ref + 1, resp + 1, cal != null ? ", calibrated" : "", h.averages()));
    }

    private static MeasuredResponse noise(WavReader reader, WavFormat f, int n, int ch, Calibration cal, double[] band)
            throws IOException {
        WelchEstimator est = new WelchEstimator();
        est.prepare(f.sampleRateHz(), WelchSettings.of(n));
        double[] buf = new double[BLOCK_FRAMES * f.channels()];
        for (int got; (got = reader.readFrames(buf, BLOCK_FRAMES)) > 0; ) {
            if (Thread.currentThread().isInterrupted()) {
                throw new DiagnosisException("diagnose: cancelled");
            }
            est.acceptInterleaved(buf, got, f.channels(), ch);
        }
        SpectralDensity d = est.snapshot();
        return CaptureResponses.fromNoise(d, band[0], band[1], cal, f("noise source on channel %d, level "
                + "unknown%s, %d averages", ch + 1, cal != null ? ", calibrated" : "", d.averages()));
    }
}
