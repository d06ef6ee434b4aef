package org.roseate.cli;

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.SecureRandom;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.Locale;
import java.util.concurrent.Callable;
import java.util.function.Supplier;
import org.roseate.audio.AudioDeviceException;
import org.roseate.audio.Devices;
import org.roseate.audio.OutputLine;
import org.roseate.audio.PlaybackEngine;
import org.roseate.audio.PlaybackSettings;
import org.roseate.io.AtomicOutput;
import org.roseate.listen.AbxLog;
import org.roseate.listen.AbxOutcome;
import org.roseate.listen.AbxSession;
import org.roseate.listen.Binomial;
import org.roseate.listen.Side;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.FrameSource;
import org.roseate.noise.NoiseChain;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code listen-test A B}: a blind ABX test of two designs (or ideal-pink, white) on the sound card. */
@Command(name = "listen-test", mixinStandardHelpOptions = true,
        description = {"Blind ABX test: can A and B be told apart by ear? Each trial plays A, B and a hidden X (A or B, "
                + "drawn at random) on request, all at the same RMS level; you say whether X is A or B.",
            "Keys, one per line then Enter: a, b, x = play A, B or X; xa = answer 'X is A'; xb = answer 'X is B'; "
                + "h = help; q = stop.",
            "The number of trials is fixed before the first one and the test cannot end early with a result: "
                + "checking the score as you go and stopping when it looks good makes a chance result look "
                + "significant far more often than 5 %%.",
            "A, B and X replay the same seeded noise from its start at every switch, so A and B differ only by "
                + "their filters. At the end: the count correct, the one-sided binomial p-value and the smallest "
                + "count significant at 5 %%. Every trial is logged to a JSON file."})
final class ListenTestCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "A", description = "design file, ideal-pink or white")
    String a;

    @Parameters(index = "1", paramLabel = "B", description = "design file, ideal-pink or white")
    String b;

    @Option(names = "--trials", defaultValue = "16", description = "number of trials, 5 to 1000, fixed before the first (default: ${DEFAULT-VALUE})")
    int trials;

    @Option(names = "--seed", description = "seed of the trial order (default: a random one, written to the log)")
    Long seed;

    @Option(names = "--log", paramLabel = "FILE.json",
            description = "trial log, written after every answer (default: listen-test-<UTC time>.json)")
    Path log;

    @Option(names = "--force", description = "replace an existing log file")
    boolean force;

    @Option(names = "--device", paramLabel = "NAME|INDEX", description = "output device (see 'roseate devices'; default: the default output)")
    String device;

    @Option(names = "--rate", defaultValue = "48000", description = "sample rate in Hz (default: ${DEFAULT-VALUE})")
    int rateHz;

    @Option(names = "--buffer-ms", defaultValue = "100", description = "device buffer in ms (default: ${DEFAULT-VALUE})")
    double bufferMs;

    @Option(names = "--level", defaultValue = "-30", paramLabel = "DBFS",
            description = "RMS level of A, B and X in dBFS, a full-scale sine = 0 dBFS (AES17) (default: ${DEFAULT-VALUE})")
    double levelDbfs;

    @Option(names = "--allow-loud", description = "allow levels above " + PlayCommand.LOUD_DBFS + " dBFS")
    boolean allowLoud;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    private final Supplier<Reader> input;

    /** Reads the keys from standard input. */
    ListenTestCommand() {
        this(() -> new InputStreamReader(System.in, StandardCharsets.UTF_8));
    }

    /** Reads the keys from the given input (for scripted runs). */
    ListenTestCommand(Supplier<Reader> input) {
        this.input = input;
    }

    @Override
    public Integer call() throws Exception {
        checkArguments();
        long orderSeed = seed != null ? seed : new SecureRandom().nextLong();
        Path logFile = log != null ? log : Path.of("listen-test-"
                + DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss", Locale.ROOT).withZone(ZoneOffset.UTC).format(Instant.now()) + ".json");
        if (!logFile.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".json")) {
            throw new UserInputException("--log " + logFile + ": expected a .json file");
        }
        if (Files.exists(logFile) && !force) {
            throw new UserInputException(logFile + " already exists; add --force to replace it");
        }
        NoiseChain chainA = chain(a);
        NoiseChain chainB = chain(b);

        PrintWriter out = spec.commandLine().getOut();
        out.println(PlayCommand.CAUTION);
        out.println(Numbers.f("A: %s (%s)", a, chainA.describe()));
        out.println(Numbers.f("B: %s (%s)", b, chainB.describe()));
        out.println(Numbers.f("Level: %.1f dBFS RMS for A, B and X (full-scale sine = 0 dBFS), after a 1 s ramp from silence",
                levelDbfs));
        out.println(Numbers.f("%d trials, fixed; a score of %d or more would be significant at 5 %%. Log: %s",
                trials, Binomial.smallestSignificantCount(trials, AbxSession.ALPHA), logFile));
        out.flush();

        int bufferFrames = Math.max(16, (int) Math.round(bufferMs / 1000 * rateHz));
        OutputLine line = PlayCommand.open(() -> Devices.openOutput(device, rateHz, 2, bufferFrames));
        PlaybackEngine engine = new PlaybackEngine(line, new Silence(rateHz, 2), PlaybackSettings.defaults());
        AbxConsole.Player player = new AbxConsole.Player() {
            @Override
            public void play(Side side) {
                engine.throwIfFailed();
                engine.switchTo((side == Side.A ? chainA : chainB).withLevel(levelDbfs));
            }

            @Override
            public void silence() {
                engine.switchTo(new Silence(rateHz, 2));
            }
        };
        boolean[] first = {true};
        AbxConsole.LogSink sink = trialsSoFar -> {
            AtomicOutput.writeString(logFile, new AbxLog(a, b, levelDbfs, orderSeed, trials, trialsSoFar).toJson(),
                    force || !first[0]);
            first[0] = false;
        };
        AbxSession session = new AbxSession(trials, orderSeed, Instant.now());
        AbxOutcome outcome;
        engine.start();
        try (BufferedReader in = new BufferedReader(input.get())) {
            outcome = new AbxConsole(session, player, sink, out, Clock.systemUTC()).run(in);
        } catch (AudioDeviceException e) {
            throw PlayCommand.deviceError(e);
        } finally {
            engine.stop();
        }
        AudioDeviceException f = engine.failure();
        if (f != null) {
            throw PlayCommand.deviceError(f);
        }
        out.println(Numbers.f("Seed %d; log written to %s", orderSeed, logFile));
        out.flush();
        return 0;
    }

    private void checkArguments() {
        if (!(levelDbfs <= 0)) {
            throw new UserInputException(Numbers.f("--level %.1f dBFS RMS is above full scale (0 dBFS) and would clip", levelDbfs));
        }
        if (levelDbfs > PlayCommand.LOUD_DBFS && !allowLoud) {
            throw new UserInputException(Numbers.f("--level %.1f dBFS is loud; levels above %.0f dBFS need --allow-loud "
                    + "(start low and turn the amplifier up slowly)", levelDbfs, PlayCommand.LOUD_DBFS));
        }
        if (levelDbfs < -120) {
            throw new UserInputException(Numbers.f("--level %.1f dBFS: expected -120 to 0", levelDbfs));
        }
        if (trials < 5 || trials > Binomial.MAX_TRIALS) {
            throw new UserInputException("--trials: expected 5 to " + Binomial.MAX_TRIALS + " (with fewer than 5 no score "
                    + "is significant at 5 %), found " + trials);
        }
        if (rateHz < 8000 || rateHz > 384000) {
            throw new UserInputException("--rate: expected 8000 to 384000 Hz, found " + rateHz);
        }
        if (!(bufferMs >= 5 && bufferMs <= 2000)) {
            throw new UserInputException(Numbers.f("--buffer-ms: expected 5 to 2000, found %s", bufferMs));
        }
    }

    /** ideal-pink, white, or a design file; every side starts from the same noise seed. */
    private NoiseChain chain(String what) {
        ChainSettings s = new ChainSettings(rateHz, 2, false, 1L, levelDbfs);
        String key = what.trim().toLowerCase(Locale.ROOT);
        if (key.equals("ideal-pink")) {
            return NoiseChain.idealPink(s);
        }
        if (key.equals("white")) {
            return NoiseChain.white(s);
        }
        return NoiseChain.design(Inputs.model(Path.of(what)).zpk(), s, Path.of(what).getFileName().toString());
    }

    /** Digital silence. */
    private record Silence(int rateHz, int channels) implements FrameSource {
        @Override
        public double sampleRateHz() {
            return rateHz;
        }

        @Override
        public void render(double[] interleaved, int frames) {
            java.util.Arrays.fill(interleaved, 0, frames * channels, 0.0);
        }
    }
}
