package org.roseate.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.digital.UnrenderableModelException;
import org.roseate.io.AtomicOutput;
import org.roseate.io.CsvWriter;
import org.roseate.io.OutputExistsException;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;
import org.roseate.noise.SignalStatistics;
import org.roseate.noise.WhiteNoiseSource;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code render DESIGN.json -o out.wav}: the design's noise to a file, streaming. */
@Command(name = "render", mixinStandardHelpOptions = true,
        description = {"Render white noise through the design's digital model to a WAV file (or, at control rates, "
                + "WAV or CSV). A design with a \"source\" renders its real output in volts: the source and the circuit's "
                + "own noise (CSV of volts at control rates; --volts-per-fs maps volts to a WAV). Memory stays constant "
                + "whatever the duration; the file appears only when complete."})
final class RenderCommand implements Callable<Integer> {
    static final int[] AUDIO_RATES = {44100, 48000, 96000, 192000};

    enum Source { design, white, ideal_pink }

    @Parameters(index = "0", arity = "0..1", paramLabel = "DESIGN.json", description = "design file (not needed for --source white or ideal-pink)")
    Path design;

    @Option(names = {"-o", "--output"}, required = true, paramLabel = "FILE", description = "output file: .wav, or .csv in control-rate mode")
    Path output;

    @Option(names = "--source", defaultValue = "design", paramLabel = "design|white|ideal-pink",
            converter = SourceConverter.class, description = "what to render (default: ${DEFAULT-VALUE})")
    Source source;

    @Option(names = "--seconds", defaultValue = "10", description = "duration in seconds (default: ${DEFAULT-VALUE})")
    double seconds;

    @Option(names = "--rate", defaultValue = "48000", description = "sample rate: 44100, 48000, 96000 or 192000 Hz (default: ${DEFAULT-VALUE})")
    int rate;

    @Option(names = "--control-rate", paramLabel = "HZ", description = "control-rate mode for slow random voltages: any rate from 100 to 4000 Hz")
    Integer controlRate;

    @Option(names = "--bits", defaultValue = "24", paramLabel = "16|24|32f", description = "sample format; 16 and 24 bits get TPDF dither (default: ${DEFAULT-VALUE})")
    String bits;

    @Option(names = "--channels", defaultValue = "1", description = "1 or 2 (default: ${DEFAULT-VALUE})")
    int channels;

    @Option(names = "--identical", description = "with 2 channels: the same noise on both (default: independent)")
    boolean identical;

    @Option(names = "--seed", defaultValue = "1", description = "noise seed; the same seed gives the same file (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--level", defaultValue = "-20", paramLabel = "DBFS", description = "RMS level in dBFS, full-scale sine = 0 dBFS (default: ${DEFAULT-VALUE})")
    double levelDbfs;

    @Option(names = "--distribution", defaultValue = "gaussian", paramLabel = "gaussian|uniform", description = "white-noise distribution (default: ${DEFAULT-VALUE})")
    String distribution;

    @Option(names = "--soft-limit", description = "apply a soft limiter above −1 dBFS (off by default)")
    boolean softLimit;

    @Option(names = "--volts-per-fs", paramLabel = "V", description = "control-rate mode only: volts at full scale, for CSV values and statistics in volts")
    Double voltsPerFs;

    @Option(names = "--force", description = "replace an existing output file")
    boolean force;

    @Option(names = "--source-capture", paramLabel = "SOURCE.wav", description = "a capture of the bare noise source: its d "
            + "and 1/f corner are fitted (as 'budget --source-capture' does) and replace the design's \"source\"")
    Path sourceCapture;

    @Option(names = "--source-volts-per-fs", paramLabel = "V", description = "with --source-capture: volts at the capture's full scale")
    Double sourceVoltsPerFs;

    @Option(names = "--source-calibration", paramLabel = "cal.json", description = "with --source-capture: a calibration from "
            + "'measure --save-calibration' that carries the capture's volts per full scale")
    Path sourceCalibration;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    static final class SourceConverter implements picocli.CommandLine.ITypeConverter<Source> {
        @Override
        public Source convert(String value) {
            return switch (value.toLowerCase(Locale.ROOT)) {
                case "design" -> Source.design;
                case "white" -> Source.white;
                case "ideal-pink", "ideal_pink", "pink" -> Source.ideal_pink;
                default -> throw new picocli.CommandLine.TypeConversionException(
                        "expected design, white or ideal-pink, found '" + value + "'");
            };
        }
    }

    enum Format { table, json }

    @Option(names = "--format", defaultValue = "table", paramLabel = "table|json",
            description = "what to print: a table, or JSON with the written file's figures (default: ${DEFAULT-VALUE})")
    Format format;

    @Override
    public Integer call() throws IOException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        boolean control = controlRate != null;
        picocli.CommandLine.ParseResult parsed = spec.commandLine().getParseResult();
        if (control && parsed != null && parsed.hasMatchedOption("--rate")) {
            throw new UserInputException("--rate and --control-rate both given: use --rate for audio files (44100 to 192000 Hz)"
                    + " or --control-rate for slow control voltages (100 to 4000 Hz), not both");
        }
        double rateHz = checkRate(control);
        if (!(seconds > 0) || seconds > 24 * 3600) {
            throw new UserInputException("--seconds: expected a duration from 0 to 86400 s, found " + seconds);
        }
        long frames = Math.round(seconds * rateHz);
        if (frames < 1) {
            throw new UserInputException(Numbers.f("--seconds: %s s is shorter than one sample at %.0f Hz (%.3g s)",
                    Double.toString(seconds), rateHz, 1 / rateHz));
        }
        if (channels != 1 && channels != 2) {
            throw new UserInputException("--channels: expected 1 or 2, found " + channels);
        }
        if (!(levelDbfs <= 0) || levelDbfs < -120) {
            throw new UserInputException("--level: expected an RMS level from -120 to 0 dBFS, found " + levelDbfs);
        }
        WhiteNoiseSource.Distribution dist = switch (distribution.toLowerCase(Locale.ROOT)) {
            case "gaussian", "normal" -> WhiteNoiseSource.Distribution.GAUSSIAN;
            case "uniform" -> WhiteNoiseSource.Distribution.UNIFORM;
            default -> throw new UserInputException("--distribution: expected gaussian or uniform, found '" + distribution + "'");
        };
        boolean csv = output.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".csv");
        if (csv && !control) {
            throw new UserInputException("-o " + output.getFileName() + ": CSV output is for control-rate mode (--control-rate HZ); use .wav at audio rates");
        }
        if (!csv && !output.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".wav")) {
            throw new UserInputException("-o " + output.getFileName() + ": expected a .wav file" + (control ? " or a .csv file" : ""));
        }
        SampleEncoding encoding = encoding();
        if (voltsPerFs != null && !(voltsPerFs > 0 && Double.isFinite(voltsPerFs))) {
            throw new UserInputException("--volts-per-fs: expected a positive number, found " + voltsPerFs);
        }
        if (source == Source.design && design == null) {
            throw new UserInputException("render: name a design file, or use --source white or --source ideal-pink");
        }
        if (sourceCapture == null && (sourceVoltsPerFs != null || sourceCalibration != null)) {
            throw new UserInputException((sourceVoltsPerFs != null ? "--source-volts-per-fs" : "--source-calibration")
                    + " needs --source-capture: it scales the capture of the bare source");
        }
        if (sourceCapture != null && source != Source.design) {
            throw new UserInputException("--source-capture needs --source design: it replaces a design's \"source\"");
        }
        Design sourced = null;
        if (source == Source.design) {
            Design d = DesignReader.read(design);
            if (sourceCapture != null) {
                org.roseate.budget.SourceFit.Result fit = SourceCapture.fit(sourceCapture, sourceVoltsPerFs, sourceCalibration,
                        err, "--source-volts-per-fs", "--source-calibration");
                d = d.withSource(java.util.Optional.of(fit.source()), d.temperatureC());
                if (format == Format.table) {
                    out.println(SourceCapture.describe(sourceCapture, fit));
                }
            }
            if (d.source().isPresent()) {
                sourced = d;
            }
        }
        if (voltsPerFs != null && !control && sourced == null) {
            throw new UserInputException("--volts-per-fs at audio rates needs a design with a \"source\" (then the file holds"
                    + " its output in volts); without one the noise has no voltage, and audio files are written at --level");
        }
        if (sourced != null) {
            checkVoltsOptions(control, csv, parsed, rateHz);
        }
        if (!force && Files.exists(output, LinkOption.NOFOLLOW_LINKS)) {
            // Checked before any work; AtomicOutput checks again when it commits.
            throw new UserInputException(new OutputExistsException(output).getMessage());
        }
        if (sourced != null) {
            return new VoltsOutput(this, sourced, rateHz, frames, control, csv, encoding, out, err).run();
        }
        ChainSettings settings = new ChainSettings(rateHz, channels, identical, seed, levelDbfs, dist, softLimit);
        NoiseChain chain = chain(settings);

        if (format == Format.table) {
            out.println("Rendering " + chain.describe() + " to " + output.getFileName() + Numbers.f(": %.3f s at %.0f Hz, %d channel%s, %s",
                    frames / rateHz, rateHz, channels, channels == 1 ? "" : "s" + (identical ? " (identical)" : " (independent)"),
                    csv ? "CSV" : encoding.label().equals("32f") ? "32-bit float" : encoding.bitsPerSample() + "-bit PCM with TPDF dither"));
            chain.fidelity().ifPresent(f -> out.print(Fidelity.table(f, NoiseChain.FIDELITY_TOLERANCE_DB)));
        }

        SignalStatistics stats = control
                ? new SignalStatistics(-1, 1, SignalStatistics.DEFAULT_BINS)
                : new SignalStatistics();
        long clipped;
        try (AtomicOutput target = AtomicOutput.open(output, force)) {
            clipped = csv ? writeCsv(target, chain, frames, stats, err) : writeWav(target, chain, frames, encoding, stats, err);
            target.commit();
        } catch (OutputExistsException e) {
            throw new UserInputException(e.getMessage());
        } catch (IOException e) {
            throw new UserInputException("cannot write " + output.getFileName() + ": " + e.getMessage() + " (nothing was left behind)");
        }
        if (format == Format.json) {
            out.print(json(chain, frames, csv ? "csv" : encoding.label(), stats, clipped, control));
            out.flush();
        } else {
            printStatistics(out, stats, clipped, control);
        }
        return 0;
    }

    /** The figures of the written file as JSON (keys named in the issue that asked for them). */
    private String json(NoiseChain chain, long frames, String encodingLabel, SignalStatistics s, long clipped, boolean control) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = m.createObjectNode();
        root.put("output", output.toString());
        root.put("source", chain.describe());
        root.put("sampleRateHz", chain.sampleRateHz());
        root.put("frames", frames);
        root.put("seconds", frames / chain.sampleRateHz());
        root.put("channels", chain.channels());
        root.put("encoding", encodingLabel);
        root.put("requestedLevelDbfs", levelDbfs);
        root.put("levelDbfs", s.rmsDbfs());
        root.put("peakDbfs", s.peakDbfs());
        root.put("crestFactorDb", s.crestFactorDb());
        root.put("clippedSamples", clipped);
        root.put("softLimiter", softLimit);
        root.put("oversamplingFactor", chain.oversamplingFactor());
        root.put("fidelityToleranceDb", NoiseChain.FIDELITY_TOLERANCE_DB);
        ArrayNode bands = root.putArray("fidelity");
        chain.fidelity().ifPresent(f -> Fidelity.json(f, NoiseChain.FIDELITY_TOLERANCE_DB, bands));
        if (control) {
            double k = voltsPerFs == null ? 1 : voltsPerFs;
            root.put("unit", voltsPerFs == null ? "fs" : "volts");
            if (voltsPerFs != null) {
                root.put("voltsPerFs", voltsPerFs);
            }
            root.put("mean", s.mean() * k);
            root.put("rms", s.rms() * k);
            root.put("peak", s.peak() * k);
            ObjectNode pct = root.putObject("percentiles");
            for (double p : PERCENTILES) {
                pct.put(p == (long) p ? Long.toString((long) p) : Double.toString(p), s.percentile(p) * k);
            }
        }
        try {
            return m.writeValueAsString(root) + System.lineSeparator();
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException("JSON of plain numbers cannot fail", e);
        }
    }

    /**
     * The options a design with a source takes: its output is volts, so at control rates --level does
     * not apply; the input noise is the source's own (Gaussian), and nothing may bend the volts.
     */
    private void checkVoltsOptions(boolean control, boolean csv, picocli.CommandLine.ParseResult parsed, double rateHz) {
        boolean levelGiven = parsed != null && parsed.hasMatchedOption("--level");
        if (control && levelGiven) {
            throw new UserInputException("--level does not apply: " + design.getFileName() + " has a \"source\", so a"
                    + " control-rate render holds the circuit's real output in volts (its level is what 'roseate budget'"
                    + " reports, not a choice); leave out --level");
        }
        if (voltsPerFs != null && levelGiven) {
            throw new UserInputException("--level and --volts-per-fs both given: with --volts-per-fs the file holds the"
                    + " circuit's output in volts, whose level is set by the source, not by --level");
        }
        if (csv && voltsPerFs != null) {
            throw new UserInputException("--volts-per-fs has no meaning here: " + design.getFileName() + " has a \"source\","
                    + " so the CSV holds volts already");
        }
        if (control && !csv && voltsPerFs == null) {
            throw new UserInputException("--volts-per-fs is needed: " + design.getFileName() + " has a \"source\", so a"
                    + " control-rate WAV holds volts and needs the volts at full scale (or write a .csv, which holds volts)");
        }
        if (!distribution.equalsIgnoreCase("gaussian") && !distribution.equalsIgnoreCase("normal")) {
            throw new UserInputException("--distribution " + distribution + " does not apply: " + design.getFileName()
                    + " has a \"source\", whose noise is Gaussian");
        }
        if (softLimit) {
            throw new UserInputException("--soft-limit does not apply: " + design.getFileName() + " has a \"source\", and"
                    + " its output is rendered in volts unbent");
        }
        double min = org.roseate.budget.VoltsRender.minimumSeconds(rateHz);
        if (seconds < min) {
            throw new UserInputException(Numbers.f("--seconds: %s s is too short for a design with a \"source\" at %.0f Hz:"
                    + " the render's band runs from 1/T to %s, and needs at least %.3g s to span a decade",
                    Double.toString(seconds), rateHz, Numbers.hz(org.roseate.digital.Decimator.audioPassbandEdgeHz(rateHz)), min));
        }
    }

    static final double[] PERCENTILES = {0.1, 1, 5, 25, 50, 75, 95, 99, 99.9};

    private double checkRate(boolean control) {
        if (control) {
            if (controlRate < 100 || controlRate > 4000) {
                throw new UserInputException("--control-rate: expected 100 to 4000 Hz, found " + controlRate);
            }
            return controlRate;
        }
        for (int r : AUDIO_RATES) {
            if (r == rate) {
                return rate;
            }
        }
        throw new UserInputException("--rate: expected 44100, 48000, 96000 or 192000, found " + rate
                + " (for slow control voltages use --control-rate)");
    }

    private SampleEncoding encoding() {
        return switch (bits.toLowerCase(Locale.ROOT)) {
            case "16" -> SampleEncoding.PCM_16;
            case "24" -> SampleEncoding.PCM_24;
            case "32f", "float" -> SampleEncoding.FLOAT_32;
            default -> throw new UserInputException("--bits: expected 16, 24 or 32f, found '" + bits + "'");
        };
    }

    private NoiseChain chain(ChainSettings settings) {
        try {
            return switch (source) {
                case white -> NoiseChain.white(settings);
                case ideal_pink -> NoiseChain.idealPink(settings);
                default -> NoiseChain.design(Inputs.model(design).zpk(), settings, design.getFileName().toString());
            };
        } catch (UnrenderableModelException e) {
            throw new UserInputException((design == null ? "" : design.getFileName() + ": ") + "cannot render: " + e.getMessage());
        }
    }

    private static final int BLOCK_FRAMES = 4096;

    private long writeWav(AtomicOutput target, NoiseChain chain, long frames, SampleEncoding encoding,
            SignalStatistics stats, PrintWriter err) throws IOException {
        WavWriter w = new WavWriter(target.stream(), new WavFormat((int) chain.sampleRateHz(), chain.channels(), encoding),
                frames, seed ^ 0x5DEECE66DL);
        Progress progress = new Progress(err, "render");
        int channels = chain.channels();
        // The statistics are those of the file: the values after dither, rounding and clipping.
        // Written on a second thread while the next block renders (same blocks, same order).
        try (WriteBehind writer = new WriteBehind(BLOCK_FRAMES * channels, (buf, n) -> {
            w.writeFrames(buf, n, buf);
            stats.accept(buf, 0, n * channels);
        })) {
            long done = 0;
            while (done < frames) {
                int n = (int) Math.min(BLOCK_FRAMES, frames - done);
                double[] buf = writer.spare();
                chain.render(buf, n);
                writer.submit(buf, n);
                done += n;
                progress.update((double) done / frames);
            }
            writer.finish();
        }
        w.finish();
        progress.done();
        return w.clippedSamples();
    }

    private long writeCsv(AtomicOutput target, NoiseChain chain, long frames, SignalStatistics stats,
            PrintWriter err) throws IOException {
        BufferedWriter bw = new BufferedWriter(new OutputStreamWriter(target.stream(), StandardCharsets.UTF_8));
        String unit = voltsPerFs == null ? "fs" : "volts";
        List<String> header = chain.channels() == 1 ? List.of("seconds", unit)
                : List.of("seconds", unit + "_1", unit + "_2");
        CsvWriter csv = new CsvWriter(bw, header);
        double scale = voltsPerFs == null ? 1 : voltsPerFs;
        double[] buf = new double[BLOCK_FRAMES * chain.channels()];
        double[] row = new double[1 + chain.channels()];
        Progress progress = new Progress(err, "render");
        long done = 0;
        long clipped = 0;
        while (done < frames) {
            int n = (int) Math.min(BLOCK_FRAMES, frames - done);
            chain.render(buf, n);
            stats.accept(buf, 0, n * chain.channels());
            for (int i = 0; i < n; i++) {
                row[0] = (done + i) / chain.sampleRateHz();
                for (int c = 0; c < chain.channels(); c++) {
                    double v = buf[i * chain.channels() + c];
                    if (Math.abs(v) >= 1) {
                        clipped++;
                    }
                    row[1 + c] = v * scale;
                }
                csv.numberRow(row);
            }
            done += n;
            progress.update((double) done / frames);
        }
        csv.flush();
        bw.flush();
        progress.done();
        return clipped;
    }

    private void printStatistics(PrintWriter out, SignalStatistics s, long clipped, boolean control) {
        out.println(Numbers.f("Level: %.2f dBFS RMS (requested %.2f), peak %.2f dBFS, crest factor %.2f dB; %d clipped sample%s%s",
                s.rmsDbfs(), levelDbfs, s.peakDbfs(), s.crestFactorDb(), clipped, clipped == 1 ? "" : "s",
                softLimit ? " (soft limiter on)" : ""));
        if (control) {
            double k = voltsPerFs == null ? 1 : voltsPerFs;
            String u = voltsPerFs == null ? " FS" : " V";
            out.println(Numbers.f("Statistics: mean %+.5f%s, RMS %.5f%s, peak %.5f%s", s.mean() * k, u, s.rms() * k, u, s.peak() * k, u));
            StringBuilder sb = new StringBuilder("Percentiles:");
            for (double p : PERCENTILES) {
                sb.append(Numbers.f("  %s%%: %+.4f%s", p == (long) p ? Long.toString((long) p) : Double.toString(p), s.percentile(p) * k, u));
            }
            out.println(sb);
        }
        out.println("Wrote " + output);
    }
}
