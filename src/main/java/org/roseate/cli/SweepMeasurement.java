package org.roseate.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.atomic.AtomicInteger;
import org.roseate.audio.AudioDeviceException;
import org.roseate.audio.CaptureEngine;
import org.roseate.audio.Devices;
import org.roseate.audio.InputLine;
import org.roseate.audio.OutputLine;
import org.roseate.audio.PlaybackEngine;
import org.roseate.audio.PlaybackSettings;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;
import org.roseate.noise.FrameSource;
import org.roseate.sweep.SweepAnalyzer;
import org.roseate.sweep.SweepPoint;
import org.roseate.sweep.SweepResult;
import org.roseate.sweep.SweepSource;
import org.roseate.sweep.SweepSpec;

/**
 * The swept-sine path of {@code measure}:
 * analysis of a capture file ({@link #fromFile}), a live play-and-record ({@link #recordLive}),
 * and the table, JSON or CSV output ({@link #format}).
 * {@code measure --sweep} ({@link MeasureCommand}) calls {@link #measure}.
 */
public final class SweepMeasurement {
    /** Silence before the sweep in a live measurement: the playback engine's 1 s safety ramp plus margin. */
    static final double LEAD_SECONDS = 1.5;
    /** Extra recording after the analysis' required tail, for the path's latency. */
    static final double LATENCY_MARGIN_SECONDS = 1.0;
    /** Room in the recording for the time between starting capture and starting playback (opening the output). */
    static final double START_ROOM_SECONDS = 5.0;
    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private SweepMeasurement() {
    }

    /**
     * Analyses a capture file.
     *
     * @param responseChannel  0-based response channel
     * @param referenceChannel 0-based reference channel, or −1 for none (the response is compared with the sweep itself)
     */
    public static SweepResult fromFile(Path wav, SweepOptions options, int responseChannel, int referenceChannel) {
        String name = wav.getFileName().toString();
        if (Files.isDirectory(wav)) {
            throw new UserInputException(name + ": is a folder, not a WAV file");
        }
        try {
            int channels;
            double rate;
            try (WavReader r = WavReader.open(wav)) {
                channels = r.format().channels();
                rate = r.format().sampleRateHz();
            }
            for (int c : new int[] {responseChannel, referenceChannel}) {
                if (c >= channels) {
                    throw new UserInputException(Numbers.f("%s: channel %d is out of range; the file has %d channel%s", name,
                            c + 1, channels, channels == 1 ? "" : "s"));
                }
            }
            SweepSpec spec = options.spec(rate);
            double[] resp = WavReader.readAllChannel(wav, responseChannel);
            double[] ref = referenceChannel >= 0 ? WavReader.readAllChannel(wav, referenceChannel) : null;
            return analyze(name, spec, ref, resp, options.pointsPerOctave());
        } catch (NoSuchFileException e) {
            throw new UserInputException(name + ": no such file");
        } catch (AccessDeniedException e) {
            throw new UserInputException(name + ": permission denied");
        } catch (WavFormatException e) {
            throw new UserInputException(e.getMessage());
        } catch (IOException e) {
            throw new UserInputException(name + ": cannot read (" + e.getMessage() + ")");
        }
    }

    static SweepResult analyze(String name, SweepSpec spec, double[] ref, double[] resp, int pointsPerOctave) {
        try {
            return SweepAnalyzer.analyze(spec, ref, resp, pointsPerOctave);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(name + ": " + e.getMessage());
        }
    }

    /** The live recording's length for a sweep: lead, sweep, required tail and latency margin, seconds. */
    public static double recordingSeconds(SweepSpec spec) {
        return LEAD_SECONDS + spec.durationSeconds() + SweepAnalyzer.requiredTailSeconds(spec) + LATENCY_MARGIN_SECONDS;
    }

    /**
     * Plays a source out and records the input at the same time; returns the recording per channel,
     * from the capture's start until {@code seconds} after playback started. Capture starts before
     * playback, so the whole source is in the recording.
     *
     * @throws DeviceException for a missing, busy or stalled device (exit 3)
     */
    public static double[][] recordLive(FrameSource source, String outputDevice, String inputDevice, int rateHz,
            int inputChannels, double seconds, PrintWriter status) {
        int bufferFrames = (int) Math.round(0.1 * rateHz);
        int wanted = (int) Math.round(seconds * rateHz);
        int room = wanted + (int) (START_ROOM_SECONDS * rateHz);
        double[] captured = new double[room * inputChannels];
        AtomicInteger got = new AtomicInteger();
        int frames;
        InputLine in = PlayCommand.open(() -> Devices.openInput(inputDevice, rateHz, inputChannels, bufferFrames));
        CaptureEngine capture = new CaptureEngine(in, 4 * rateHz, 2.0);
        PlaybackEngine player = null;
        try {
            capture.start();
            CaptureEngine.Delivery delivery = capture.deliverTo((block, n) -> {
                int at = got.get();
                int take = Math.min(n, room - at);
                System.arraycopy(block, 0, captured, at * inputChannels, take * inputChannels);
                got.set(at + take);
            });
            OutputLine out = PlayCommand.open(() -> Devices.openOutput(outputDevice, rateHz, source.channels(), bufferFrames));
            player = new PlaybackEngine(out, source, PlaybackSettings.defaults());
            status.println(Numbers.f("Playing the sweep on %s and recording %.1f s from %s", out.deviceName(), seconds,
                    in.deviceName()));
            status.flush();
            player.start();
            frames = Math.min(room, got.get() + wanted);
            long deadline = System.nanoTime() + (long) ((seconds + 5) * 1e9);
            while (got.get() < frames && capture.failure() == null && player.failure() == null && System.nanoTime() < deadline) {
                Thread.sleep(20);
            }
            player.stop();
            capture.stop();
            delivery.finish();
            player.throwIfFailed();
            capture.throwIfFailed();
            if (got.get() < frames) {
                throw new DeviceException("input device '" + in.deviceName() + "' delivered " + got.get() + " of " + frames
                        + " frames in time; check the device and try again, or measure a WAV file");
            }
        } catch (AudioDeviceException e) {
            throw PlayCommand.deviceError(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new UserInputException("recording interrupted");
        } finally {
            if (player != null) {
                player.stop();
            }
            capture.stop();
        }
        double[][] channels = new double[inputChannels][frames];
        for (int i = 0; i < frames; i++) {
            for (int c = 0; c < inputChannels; c++) {
                channels[c][i] = captured[i * inputChannels + c];
            }
        }
        return channels;
    }

    /** Peak amplitude of a sweep at an RMS level in dBFS: AES17 refers dBFS to a full-scale sine, so a sine of peak P reads 20·log10 P. */
    public static double peakForLevel(double levelDbfs) {
        return Math.pow(10, levelDbfs / 20);
    }

    /** Refuses a --format other than table, json or csv. */
    public static void checkFormat(String format) {
        String f = format.toLowerCase(Locale.ROOT);
        if (!f.equals("table") && !f.equals("json") && !f.equals("csv")) {
            throw new UserInputException("--format: expected table, json or csv, found '" + format + "'");
        }
    }

    /** The result as a table, JSON or CSV. NaN figures print as "-" (table), null (JSON) or empty (CSV). */
    public static String format(SweepResult r, String format) {
        return switch (format.toLowerCase(Locale.ROOT)) {
            case "table" -> table(r);
            case "json" -> json(r);
            case "csv" -> csv(r);
            default -> throw new UserInputException("--format: expected table, json or csv, found '" + format + "'");
        };
    }

    private static String table(SweepResult r) {
        SweepSpec s = r.spec();
        StringBuilder sb = new StringBuilder();
        sb.append(Numbers.f("Exponential sweep %s to %s in %.2f s (fades %.0f ms) at %.0f Hz; impulse at %.4f s%s%n",
                Numbers.hz(s.startHz()), Numbers.hz(s.endHz()), s.durationSeconds(), s.fadeSeconds() * 1000, s.sampleRateHz(),
                r.latencySeconds(), r.referenceGiven() ? "" : " (no reference channel: H is response / sweep)"));
        sb.append("± bounds come from the measured noise floor; 2nd and 3rd harmonic in dB re the fundamental at the output\n");
        sb.append(Numbers.f("%11s %18s %18s %16s %16s%n", "Hz", "|H| dB", "phase deg", "H2 dB", "H3 dB"));
        for (SweepPoint p : r.points()) {
            sb.append(Numbers.f("%11.2f %18s %18s %16s %16s%n", p.hz(), pm(p.magnitudeDb(), p.magnitudeBoundDb(), "%.3f"),
                    pm(p.phaseDeg(), p.phaseBoundDeg(), "%.2f"), pm(p.harmonic2Db(), p.harmonic2BoundDb(), "%.1f"),
                    pm(p.harmonic3Db(), p.harmonic3BoundDb(), "%.1f")));
        }
        return sb.toString();
    }

    private static String pm(double v, double bound, String pattern) {
        if (Double.isNaN(v)) {
            return "-";
        }
        return Numbers.f(pattern + " ± " + pattern, v, Math.max(bound, Math.pow(10, -decimals(pattern)) / 2));
    }

    private static int decimals(String pattern) {
        return pattern.charAt(pattern.indexOf('.') + 1) - '0';
    }

    private static String json(SweepResult r) {
        ObjectNode root = JSON.createObjectNode();
        ObjectNode s = root.putObject("sweep");
        s.put("startHz", r.spec().startHz());
        s.put("endHz", r.spec().endHz());
        s.put("durationSeconds", r.spec().durationSeconds());
        s.put("fadeSeconds", r.spec().fadeSeconds());
        s.put("sampleRateHz", r.spec().sampleRateHz());
        root.put("latencySeconds", r.latencySeconds());
        root.put("referenceChannel", r.referenceGiven());
        ArrayNode arr = root.putArray("points");
        for (SweepPoint p : r.points()) {
            ObjectNode n = arr.addObject();
            n.put("hz", p.hz());
            put(n, "magnitudeDb", p.magnitudeDb());
            put(n, "magnitudeBoundDb", p.magnitudeBoundDb());
            put(n, "phaseDeg", p.phaseDeg());
            put(n, "phaseBoundDeg", p.phaseBoundDeg());
            put(n, "harmonic2Db", p.harmonic2Db());
            put(n, "harmonic2BoundDb", p.harmonic2BoundDb());
            put(n, "harmonic3Db", p.harmonic3Db());
            put(n, "harmonic3BoundDb", p.harmonic3BoundDb());
        }
        try {
            return JSON.writeValueAsString(root) + "\n";
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
    }

    private static void put(ObjectNode n, String key, double v) {
        if (Double.isNaN(v)) {
            n.putNull(key);
        } else {
            n.put(key, v);
        }
    }

    private static String csv(SweepResult r) {
        StringBuilder sb = new StringBuilder(
                "hz,magnitudeDb,magnitudeBoundDb,phaseDeg,phaseBoundDeg,harmonic2Db,harmonic2BoundDb,harmonic3Db,harmonic3BoundDb\n");
        for (SweepPoint p : r.points()) {
            double[] v = {p.hz(), p.magnitudeDb(), p.magnitudeBoundDb(), p.phaseDeg(), p.phaseBoundDeg(), p.harmonic2Db(),
                p.harmonic2BoundDb(), p.harmonic3Db(), p.harmonic3BoundDb()};
            for (int i = 0; i < v.length; i++) {
                sb.append(i == 0 ? "" : ",").append(Numbers.plain(v[i]));
            }
            sb.append('\n');
        }
        return sb.toString();
    }

    /**
     * The sweep path of {@code measure --sweep}: from a capture file or live (play the sweep and
     * record it), then the deconvolution. Channels are 0-based; {@code referenceChannel} is −1 when
     * there is none.
     *
     * @param levelDbfs with {@code live}: the sweep's RMS level (a full-scale sine reads 0 dBFS)
     */
    public static SweepResult measure(Path file, SweepOptions sweep, boolean live, int responseChannel,
            int referenceChannel, String outputDevice, String inputDevice, int rateHz, double levelDbfs,
            boolean allowLoud, PrintWriter status) {
        if (responseChannel < 0 || referenceChannel < -1) {
            throw new UserInputException("--channel and --reference-channel count from 1");
        }
        if (responseChannel == referenceChannel) {
            throw new UserInputException("--channel and --reference-channel are both " + (responseChannel + 1)
                    + "; the response and the reference need their own channels");
        }
        if (!live) {
            return fromFile(file, sweep, responseChannel, referenceChannel);
        }
        if (!(levelDbfs <= 0)) {
            throw new UserInputException(Numbers.f("--level %.1f dBFS RMS: a sweep's peak would pass full scale", levelDbfs));
        }
        if (levelDbfs > PlayCommand.LOUD_DBFS && !allowLoud) {
            throw new UserInputException(Numbers.f("--level %.1f dBFS is loud; levels above %.0f dBFS need --allow-loud",
                    levelDbfs, PlayCommand.LOUD_DBFS));
        }
        SweepSpec s = sweep.spec(rateHz);
        status.println(PlayCommand.CAUTION);
        int inChannels = Math.max(responseChannel, referenceChannel) + 1;
        double[][] rec = recordLive(new SweepSource(s, peakForLevel(levelDbfs), 2, LEAD_SECONDS),
                outputDevice, inputDevice, rateHz, inChannels, recordingSeconds(s), status);
        return analyze("live recording", s, referenceChannel >= 0 ? rec[referenceChannel] : null,
                rec[responseChannel], sweep.pointsPerOctave());
    }
}
