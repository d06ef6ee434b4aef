package org.roseate.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import org.roseate.audio.AudioDeviceException;
import org.roseate.audio.CaptureEngine;
import org.roseate.audio.Devices;
import org.roseate.audio.InputLine;
import org.roseate.audio.OutputLine;
import org.roseate.audio.PlaybackEngine;
import org.roseate.audio.PlaybackSettings;
import org.roseate.audio.WavCaptureSink;
import org.roseate.io.AtomicOutput;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code play DESIGN.json}: the design's noise through the sound card, live. */
@Command(name = "play", mixinStandardHelpOptions = true,
        description = {"Play a design's noise (or white or ideal pink noise) through the sound card until Ctrl-C or --seconds.",
            "With two designs and --switch-every, alternate them at the same RMS level with a crossfade."})
final class PlayCommand implements Callable<Integer> {
    static final String CAUTION = "Caution: noise can damage hearing and loudspeaker tweeters. Start with the amplifier "
            + "turned down and raise it slowly; protect your ears and tweeters; keep within the noise-exposure rules "
            + "of your workplace.";
    /** Levels above this need --allow-loud, dBFS RMS. */
    static final double LOUD_DBFS = -10.0;

    enum Source { white, ideal_pink, design }

    @Parameters(arity = "0..2", paramLabel = "DESIGN.json", description = "one design, or two to alternate with --switch-every")
    List<Path> designs = new ArrayList<>();

    @Option(names = "--source", paramLabel = "white|ideal-pink|design",
            description = "what to play (default: design when a file is given)")
    String source;

    @Option(names = "--seconds", paramLabel = "S", description = "stop after S seconds (default: run until Ctrl-C)")
    Double seconds;

    @Option(names = "--device", paramLabel = "NAME|INDEX", description = "output device (see 'roseate devices'; default: the default output)")
    String device;

    @Option(names = "--rate", defaultValue = "48000", description = "sample rate in Hz (default: ${DEFAULT-VALUE})")
    int rateHz;

    @Option(names = "--channels", defaultValue = "2", description = "1 or 2 (default: ${DEFAULT-VALUE}); channels carry independent noise")
    int channels;

    @Option(names = "--buffer-ms", defaultValue = "100", description = "device buffer in ms, the output latency (default: ${DEFAULT-VALUE})")
    double bufferMs;

    @Option(names = "--level", defaultValue = "-30", paramLabel = "DBFS",
            description = "RMS level in dBFS, a full-scale sine = 0 dBFS (AES17) (default: ${DEFAULT-VALUE})")
    double levelDbfs;

    @Option(names = "--allow-loud", description = "allow levels above " + LOUD_DBFS + " dBFS")
    boolean allowLoud;

    @Option(names = "--switch-every", paramLabel = "DURATION", description = "with two designs: switch between them this often, e.g. 4s or 500ms")
    String switchEvery;

    @Option(names = "--seed", defaultValue = "1", description = "noise seed (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--save-capture", paramLabel = "FILE.wav",
            description = "also record the input device to this 16-bit WAV file while playing (needs --seconds)")
    Path saveCapture;

    @Option(names = "--input-device", paramLabel = "NAME|INDEX", description = "input device for --save-capture (default: the default input)")
    String inputDevice;

    @Option(names = "--force", description = "replace an existing --save-capture file")
    boolean force;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        checkArguments();
        Source kind = sourceKind();
        List<NoiseChain> chains = new ArrayList<>();
        List<String> names = new ArrayList<>();
        for (int i = 0; i < Math.max(1, designs.size()); i++) {
            ChainSettings s = new ChainSettings(rateHz, channels, false, seed + i, levelDbfs);
            switch (kind) {
                case white -> chains.add(NoiseChain.white(s));
                case ideal_pink -> chains.add(NoiseChain.idealPink(s));
                default -> chains.add(NoiseChain.design(Inputs.model(designs.get(i)).zpk(), s));
            }
            names.add(kind == Source.design ? designs.get(i).getFileName().toString() : kind.name().replace('_', '-'));
        }
        long switchNanos = switchEvery == null ? 0 : parseDurationNanos(switchEvery);

        PrintWriter out = spec.commandLine().getOut();
        out.println(CAUTION);
        out.flush();

        int bufferFrames = Math.max(16, (int) Math.round(bufferMs / 1000 * rateHz));
        OutputLine line = open(() -> Devices.openOutput(device, rateHz, channels, bufferFrames));
        PlaybackEngine engine = new PlaybackEngine(line, chains.get(0), PlaybackSettings.defaults());
        out.println(Numbers.f("Device: %s, %d Hz, %d channel(s), %d-bit; buffer %d frames = %.1f ms output latency",
                line.deviceName(), rateHz, channels, line.bitsPerSample(), line.bufferFrames(), engine.latencyMs()));
        out.println(Numbers.f("Level: %.1f dBFS RMS (full-scale sine = 0 dBFS), reached after a 1 s ramp from silence", levelDbfs));
        out.println("Playing " + (chains.size() == 2 ? "A: " : "") + names.get(0) + " (" + chains.get(0).describe() + ")"
                + (seconds == null ? "; press Ctrl-C to stop" : Numbers.f(" for %.1f s", seconds)));
        out.flush();

        Capture capture = saveCapture == null ? null : startCapture(out);
        AtomicBoolean reported = new AtomicBoolean();
        Thread hook = new Thread(() -> {
            engine.stop(); // Ctrl-C: fade out, then let the JVM exit
            if (reported.compareAndSet(false, true)) {
                out.println(Numbers.f("Stopped after %.1f s. Underruns: %d", engine.framesWritten() / (double) rateHz,
                        engine.underruns()));
                out.flush();
            }
        }, "roseate-play-shutdown");
        Runtime.getRuntime().addShutdownHook(hook);
        long t0 = System.nanoTime();
        try {
            engine.start();
            long nextSwitch = t0 + switchNanos;
            int playing = 0;
            long endNanos = seconds == null ? Long.MAX_VALUE : t0 + (long) (seconds * 1e9);
            while (System.nanoTime() < endNanos) {
                long wait = Math.min(endNanos, switchNanos > 0 ? nextSwitch : Long.MAX_VALUE) - System.nanoTime();
                if (engine.awaitEnd(Math.max(1, Math.min(wait / 1_000_000, 200)), TimeUnit.MILLISECONDS)) {
                    break;
                }
                if (switchNanos > 0 && System.nanoTime() >= nextSwitch && System.nanoTime() < endNanos) {
                    playing = 1 - playing;
                    engine.switchTo(chains.get(playing).withLevel(levelDbfs));
                    out.println(Numbers.f("[%7.1f s] now playing %s: %s (%s)", (System.nanoTime() - t0) * 1e-9,
                            playing == 0 ? "A" : "B", names.get(playing), chains.get(playing).describe()));
                    out.flush();
                    nextSwitch += switchNanos;
                }
            }
        } finally {
            engine.stop();
            if (capture != null) {
                capture.finish(out);
            }
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException e) {
                // already shutting down: the hook prints the summary
            }
        }
        AudioDeviceException f = engine.failure();
        if (f != null) {
            throw deviceError(f);
        }
        if (!reported.compareAndSet(false, true)) {
            return 0;
        }
        out.println(Numbers.f("Played %.1f s. Underruns: %d%s", engine.framesWritten() / (double) rateHz, engine.underruns(),
                engine.clippedSamples() > 0 ? Numbers.f(", clipped samples: %d", engine.clippedSamples()) : ""));
        out.flush();
        return 0;
    }

    private void checkArguments() {
        if (!(levelDbfs <= 0)) {
            throw new UserInputException(Numbers.f("--level %.1f dBFS RMS is above full scale (0 dBFS) and would clip", levelDbfs));
        }
        if (levelDbfs > LOUD_DBFS && !allowLoud) {
            throw new UserInputException(Numbers.f("--level %.1f dBFS is loud; levels above %.0f dBFS need --allow-loud "
                    + "(start low and turn the amplifier up slowly)", levelDbfs, LOUD_DBFS));
        }
        if (levelDbfs < -120) {
            throw new UserInputException(Numbers.f("--level %.1f dBFS: expected -120 to 0", levelDbfs));
        }
        if (rateHz < 8000 || rateHz > 384000) {
            throw new UserInputException("--rate: expected 8000 to 384000 Hz, found " + rateHz);
        }
        if (channels < 1 || channels > 2) {
            throw new UserInputException("--channels: expected 1 or 2, found " + channels);
        }
        if (!(bufferMs >= 5 && bufferMs <= 2000)) {
            throw new UserInputException(Numbers.f("--buffer-ms: expected 5 to 2000, found %s", bufferMs));
        }
        if (seconds != null && !(seconds > 0 && seconds < 1e7)) {
            throw new UserInputException("--seconds: expected a positive number, found " + seconds);
        }
        if (designs.size() == 2 && switchEvery == null) {
            throw new UserInputException("two designs need --switch-every, e.g. --switch-every 4s");
        }
        if (switchEvery != null && designs.size() != 2) {
            throw new UserInputException("--switch-every needs two design files, found " + designs.size());
        }
        if (saveCapture != null && seconds == null) {
            throw new UserInputException("--save-capture needs --seconds (the WAV header declares its length)");
        }
    }

    private Source sourceKind() {
        if (source == null) {
            if (designs.isEmpty()) {
                throw new UserInputException("name a design file, or --source white or --source ideal-pink");
            }
            return Source.design;
        }
        String key = source.trim().toLowerCase(Locale.ROOT).replace('-', '_');
        for (Source s : Source.values()) {
            if (s.name().equals(key)) {
                if (s == Source.design && designs.isEmpty()) {
                    throw new UserInputException("--source design needs a design file");
                }
                if (s != Source.design && !designs.isEmpty()) {
                    throw new UserInputException("--source " + source + " plays no design; leave out the file(s)");
                }
                return s;
            }
        }
        throw new UserInputException("--source: expected white, ideal-pink or design, found '" + source + "'");
    }

    /** "4s", "4", "0.5s", "500ms" → nanoseconds. */
    static long parseDurationNanos(String text) {
        String t = text.trim().toLowerCase(Locale.ROOT);
        double scale = 1e9;
        if (t.endsWith("ms")) {
            scale = 1e6;
            t = t.substring(0, t.length() - 2);
        } else if (t.endsWith("s")) {
            t = t.substring(0, t.length() - 1);
        }
        double v;
        try {
            v = Double.parseDouble(t.trim());
        } catch (NumberFormatException e) {
            v = Double.NaN;
        }
        long nanos = (long) (v * scale);
        if (!(v > 0) || nanos < 100_000_000L || nanos > 3_600_000_000_000L) {
            throw new UserInputException("--switch-every: expected a duration from 100ms to 1h such as 4s or 500ms, found '" + text + "'");
        }
        return nanos;
    }

    interface Opener<T> {
        T open();
    }

    static <T> T open(Opener<T> opener) {
        try {
            return opener.open();
        } catch (AudioDeviceException e) {
            throw deviceError(e);
        }
    }

    /** One line: what happened to which device, and what to try. */
    static DeviceException deviceError(AudioDeviceException e) {
        String hint = switch (e.kind()) {
            case NO_DEVICE -> "; list the devices with 'roseate devices', or write a file instead with 'roseate render DESIGN.json -o out.wav'";
            case BUSY -> "; close the program using it, choose another with --device (see 'roseate devices'), or render to a file with 'roseate render DESIGN.json -o out.wav'";
            case UNSUPPORTED_FORMAT -> "; try --rate 48000 or 44100, --channels 2, or another device (see 'roseate devices')";
            case STALLED -> "; check the sound server, driver or cable and try again, or render to a file with 'roseate render DESIGN.json -o out.wav'";
        };
        return new DeviceException(e.getMessage() + hint);
    }

    private Capture startCapture(PrintWriter out) throws IOException {
        int bufferFrames = Math.max(16, (int) Math.round(bufferMs / 1000 * rateHz));
        InputLine in = open(() -> Devices.openInput(inputDevice, rateHz, channels, bufferFrames));
        AtomicOutput file = AtomicOutput.open(saveCapture, force);
        long frames = Math.round(seconds * rateHz);
        WavCaptureSink sink = new WavCaptureSink(file.stream(), new WavFormat(rateHz, channels, SampleEncoding.PCM_16), frames);
        CaptureEngine engine = new CaptureEngine(in, 2 * rateHz, 2.0);
        engine.start();
        CaptureEngine.Delivery delivery = engine.deliverTo(sink);
        out.println("Recording " + in.deviceName() + " to " + saveCapture);
        return new Capture(engine, delivery, sink, file);
    }

    private record Capture(CaptureEngine engine, CaptureEngine.Delivery delivery, WavCaptureSink sink, AtomicOutput file) {
        void finish(PrintWriter out) throws IOException {
            engine.stop();
            try {
                delivery.finish();
                long got = sink.finish();
                file.commit();
                out.println(Numbers.f("Saved %s (%d frames captured%s)", file.target(), got,
                        engine.droppedFrames() > 0 ? ", " + engine.droppedFrames() + " dropped" : ""));
            } finally {
                file.close();
            }
            AudioDeviceException f = engine.failure();
            if (f != null) {
                throw deviceError(f);
            }
        }
    }
}
