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
import java.util.concurrent.Callable;
import java.util.concurrent.atomic.AtomicInteger;
import org.roseate.audio.AudioDeviceException;
import org.roseate.audio.CaptureEngine;
import org.roseate.audio.Devices;
import org.roseate.audio.InputLine;
import org.roseate.audio.OutputLine;
import org.roseate.audio.PlaybackEngine;
import org.roseate.audio.PlaybackSettings;
import org.roseate.circuit.DesignException;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;
import org.roseate.noise.FrameSource;
import org.roseate.sweep.SweepAnalyzer;
import org.roseate.sweep.SweepPoint;
import org.roseate.sweep.SweepResult;
import org.roseate.sweep.SweepSource;
import org.roseate.sweep.SweepSpec;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * The swept-sine path of {@code measure}, kept apart so it can be wired into the measure command:
 * analysis of a capture file ({@link #fromFile}), a live play-and-record ({@link #recordLive}),
 * and the table, JSON or CSV output ({@link #format}).
 *
 * <p>{@link Standalone} runs it without the top-level command, with measure's option names
 * ({@code --live}, {@code --transfer}, {@code --channel}, {@code --reference-channel},
 * {@code --format}, {@code --device}, {@code --output-device}, {@code --rate}, {@code --level},
 * {@code --allow-loud}); it is not registered as a subcommand.
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
     * {@code [CAPTURE.wav] --sweep …}: the sweep measurement with measure's option names, outside the
     * top-level command until it is wired into {@code measure}. Run it with {@link #run}.
     */
    @Command(name = "measure", mixinStandardHelpOptions = true,
            description = "Transfer measurement with an exponential swept sine, from a capture file or live.")
    public static final class Standalone implements Callable<Integer> {
        @Parameters(arity = "0..1", paramLabel = "CAPTURE.wav", description = "a capture of the sweep (not with --live)")
        Path file;

        @Mixin
        SweepOptions sweep = new SweepOptions();

        @Option(names = "--live", description = "play the sweep and record it")
        boolean live;

        @Option(names = "--transfer", description = "two channels: a reference and a response")
        boolean transfer;

        @Option(names = "--channel", paramLabel = "N", description = "response channel, from 1 (default: 2 with --transfer, else 1)")
        Integer channel;

        @Option(names = "--reference-channel", paramLabel = "N", description = "with --transfer: the reference channel, from 1 (default 1)")
        Integer referenceChannel;

        @Option(names = "--device", paramLabel = "NAME|INDEX", description = "with --live: input device")
        String device;

        @Option(names = "--output-device", paramLabel = "NAME|INDEX", description = "with --live: output device")
        String outputDevice;

        @Option(names = "--rate", defaultValue = "48000", description = "with --live: sample rate in Hz (default: ${DEFAULT-VALUE})")
        int rateHz;

        @Option(names = "--level", defaultValue = "-20", paramLabel = "DBFS",
                description = "with --live: the sweep's RMS level in dBFS (full-scale sine = 0 dBFS) (default: ${DEFAULT-VALUE})")
        double levelDbfs;

        @Option(names = "--allow-loud", description = "allow a sweep above " + PlayCommand.LOUD_DBFS + " dBFS")
        boolean allowLoud;

        @Option(names = "--format", defaultValue = "table", description = "table, json or csv (default: ${DEFAULT-VALUE})")
        String format;

        @Spec
        CommandLine.Model.CommandSpec spec;

        @Override
        public Integer call() {
            if (!sweep.enabled()) {
                throw new UserInputException("this entry point measures with --sweep only");
            }
            checkFormat(format);
            int resp = (channel != null ? channel : transfer ? 2 : 1) - 1;
            int ref = transfer ? (referenceChannel != null ? referenceChannel : 1) - 1 : -1;
            if (resp < 0 || (transfer && ref < 0)) {
                throw new UserInputException("--channel and --reference-channel count from 1");
            }
            if (transfer && resp == ref) {
                throw new UserInputException("--channel and --reference-channel are both " + (resp + 1)
                        + "; the response and the reference need their own channels");
            }
            SweepResult r;
            if (live) {
                if (file != null) {
                    throw new UserInputException("--live records its own capture; leave out " + file);
                }
                r = live(resp, ref);
            } else {
                if (file == null) {
                    throw new UserInputException("name a capture file, or measure with --live");
                }
                r = fromFile(file, sweep, resp, ref);
            }
            PrintWriter out = spec.commandLine().getOut();
            out.print(format(r, format));
            out.flush();
            return 0;
        }

        private SweepResult live(int resp, int ref) {
            if (!(levelDbfs <= 0)) {
                throw new UserInputException(Numbers.f("--level %.1f dBFS RMS: a sweep's peak would pass full scale", levelDbfs));
            }
            if (levelDbfs > PlayCommand.LOUD_DBFS && !allowLoud) {
                throw new UserInputException(Numbers.f("--level %.1f dBFS is loud; levels above %.0f dBFS need --allow-loud",
                        levelDbfs, PlayCommand.LOUD_DBFS));
            }
            SweepSpec s = sweep.spec(rateHz);
            PrintWriter status = spec.commandLine().getErr();
            status.println(PlayCommand.CAUTION);
            int inChannels = Math.max(resp, ref) + 1;
            double[][] rec = recordLive(new SweepSource(s, peakForLevel(levelDbfs), 2, LEAD_SECONDS),
                    outputDevice, device, rateHz, inChannels, recordingSeconds(s), status);
            return analyze("live recording", s, ref >= 0 ? rec[ref] : null, rec[resp], sweep.pointsPerOctave());
        }
    }

    /** Runs {@link Standalone} with the project's error conventions (status 2 bad input, 3 device). */
    public static int run(PrintWriter out, PrintWriter err, String... args) {
        CommandLine cl = new CommandLine(new Standalone());
        cl.setOut(out);
        cl.setErr(err);
        cl.setParameterExceptionHandler((ex, a) -> {
            err.println("roseate: " + ex.getMessage());
            return RoseateCommand.EXIT_BAD_INPUT;
        });
        cl.setExecutionExceptionHandler((ex, c, p) -> {
            if (ex instanceof UserInputException || ex instanceof DesignException) {
                err.println("roseate: " + ex.getMessage());
                return RoseateCommand.EXIT_BAD_INPUT;
            }
            if (ex instanceof DeviceException) {
                err.println("roseate: " + ex.getMessage());
                return RoseateCommand.EXIT_DEVICE;
            }
            throw ex;
        });
        int code = cl.execute(args);
        out.flush();
        err.flush();
        return code;
    }
}
