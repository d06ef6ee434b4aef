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
import java.util.List;
import org.roseate.budget.BudgetResult;
import org.roseate.budget.Gaussian;
import org.roseate.budget.RecordStatistics;
import org.roseate.budget.VoltsRender;
import org.roseate.circuit.Design;
import org.roseate.circuit.SourceNoise;
import org.roseate.digital.UnrenderableModelException;
import org.roseate.io.AtomicOutput;
import org.roseate.io.CsvWriter;
import org.roseate.io.OutputExistsException;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;
import org.roseate.noise.SignalStatistics;

/**
 * {@code render} of a design with a {@code source}: the circuit's real output in volts
 * ({@link VoltsRender}), to a CSV of volts, or to a WAV with {@code --volts-per-fs} volts at full
 * scale (at audio rates without it, the real output's shape scaled to {@code --level}).
 *
 * <p><b>Full scale.</b> Before any work, the expected number of samples beyond full scale, frames ×
 * channels × erfc(FS/(√2·RMS)) for the Gaussian output, is computed; if it is one or more the render is
 * refused, naming a {@code --volts-per-fs} that keeps it below 0.01. A sample that still reaches full
 * scale (a rarer event than that) is never clipped silently: the count is printed and a warning goes to
 * stderr.
 */
final class VoltsOutput {
    /** The expected count of samples beyond full scale the suggested --volts-per-fs keeps below. */
    static final double SUGGESTED_EXPECTED_OVERS = 0.01;
    private static final int BLOCK_FRAMES = 4096;

    private final RenderCommand cmd;
    private final Design design;
    private final double rateHz;
    private final long frames;
    private final boolean control;
    private final boolean csv;
    private final SampleEncoding encoding;
    private final PrintWriter out;
    private final PrintWriter err;

    VoltsOutput(RenderCommand cmd, Design design, double rateHz, long frames, boolean control, boolean csv,
            SampleEncoding encoding, PrintWriter out, PrintWriter err) {
        this.cmd = cmd;
        this.design = design;
        this.rateHz = rateHz;
        this.frames = frames;
        this.control = control;
        this.csv = csv;
        this.encoding = encoding;
        this.out = out;
        this.err = err;
    }

    int run() throws IOException {
        String name = cmd.design.getFileName().toString();
        VoltsRender render;
        try {
            render = VoltsRender.of(design, name, rateHz, frames / rateHz, cmd.channels, cmd.identical, cmd.seed);
        } catch (UnrenderableModelException e) {
            throw new UserInputException(name + ": cannot render: " + e.getMessage());
        }
        VoltsRender.Expectation e = render.expectation();
        // volts per full scale of the file: given, or (audio rates without it) the real shape at --level
        double fsVolts = Double.NaN;
        if (!csv) {
            fsVolts = cmd.voltsPerFs != null ? cmd.voltsPerFs
                    : e.rmsV() * Math.sqrt(2) / Math.pow(10, cmd.levelDbfs / 20);
            double overs = (double) frames * cmd.channels * Gaussian.exceedanceProbability(fsVolts, e.rmsV());
            if (cmd.voltsPerFs != null && overs >= 1) {
                throw new UserInputException(Numbers.f("--volts-per-fs %s: the output's expected RMS is %.4g V, so about %.3g"
                        + " of the %d samples would pass full scale and clip; use --volts-per-fs %.3g or more (expected"
                        + " count below %s)", java.math.BigDecimal.valueOf(cmd.voltsPerFs).stripTrailingZeros().toPlainString(), e.rmsV(), overs, frames * cmd.channels,
                        suggestedFullScale(e.rmsV(), frames * cmd.channels), Numbers.plain(SUGGESTED_EXPECTED_OVERS)));
            }
        }
        SourceNoise src = design.source().orElseThrow();
        if (cmd.format == RenderCommand.Format.table) {
            out.println("Rendering " + name + " in volts to " + cmd.output.getFileName() + Numbers.f(": %.3f s at %.0f Hz, %d channel%s, %s",
                    frames / rateHz, rateHz, cmd.channels, cmd.channels == 1 ? "" : "s" + (cmd.identical ? " (identical)" : " (independent)"),
                    csv ? "CSV of volts" : encodingLabel() + Numbers.f(", full scale = %.4g V", fsVolts)));
            out.println(Numbers.f("Source: %.4g V/√Hz white, 1/f corner %.4g Hz; with the circuit's own noise. Rendered band %s – %s"
                    + " (1/T, the slowest fluctuation the duration holds, to the decimator's passband edge)",
                    src.densityVPerRtHz(), src.flickerCornerHz(), Numbers.hz(e.fLowHz()),
                    Numbers.hz(e.fTopHz())));
            out.print(Fidelity.table(render.fidelity(), org.roseate.noise.NoiseChain.FIDELITY_TOLERANCE_DB));
            if (!csv && cmd.voltsPerFs == null) {
                out.println(Numbers.f("No --volts-per-fs: the real output's shape is scaled to %.2f dBFS (full scale = %.4g V)",
                        cmd.levelDbfs, fsVolts));
            }
        }
        int ch = cmd.channels;
        RecordStatistics rec = new RecordStatistics(rateHz, frames);
        double span = 8 * e.rmsV();
        SignalStatistics volts = new SignalStatistics(-span, span, SignalStatistics.DEFAULT_BINS);
        SignalStatistics file = new SignalStatistics();
        long clipped;
        long beyondFullScale = 0;
        double[] buf = new double[BLOCK_FRAMES * ch];
        Progress progress = new Progress(err, "render");
        try (AtomicOutput target = AtomicOutput.open(cmd.output, cmd.force)) {
            WavWriter w = null;
            CsvWriter c = null;
            BufferedWriter bw = null;
            if (csv) {
                bw = new BufferedWriter(new OutputStreamWriter(target.stream(), StandardCharsets.UTF_8));
                c = new CsvWriter(bw, ch == 1 ? List.of("seconds", "volts") : List.of("seconds", "volts_1", "volts_2"));
            } else {
                w = new WavWriter(target.stream(), new WavFormat((int) rateHz, ch, encoding), frames, cmd.seed ^ 0x5DEECE66DL);
            }
            double[] row = new double[1 + ch];
            long done = 0;
            while (done < frames) {
                int n = (int) Math.min(BLOCK_FRAMES, frames - done);
                render.render(buf, n);
                rec.accept(buf, 0, ch, n);
                volts.accept(buf, 0, n * ch);
                if (csv) {
                    for (int i = 0; i < n; i++) {
                        row[0] = (done + i) / rateHz;
                        System.arraycopy(buf, i * ch, row, 1, ch);
                        c.numberRow(row);
                    }
                } else {
                    for (int i = 0; i < n * ch; i++) {
                        buf[i] /= fsVolts;
                        if (Math.abs(buf[i]) >= 1) {
                            beyondFullScale++;
                        }
                    }
                    w.writeFrames(buf, n, buf);
                    file.accept(buf, 0, n * ch);
                }
                done += n;
                progress.update((double) done / frames);
            }
            if (csv) {
                c.flush();
                bw.flush();
                clipped = 0;
            } else {
                w.finish();
                clipped = Math.max(w.clippedSamples(), beyondFullScale);
            }
            progress.done();
            target.commit();
        } catch (OutputExistsException ex) {
            throw new UserInputException(ex.getMessage());
        } catch (IOException ex) {
            throw new UserInputException("cannot write " + cmd.output.getFileName() + ": " + ex.getMessage() + " (nothing was left behind)");
        }
        if (clipped > 0) {
            err.println(Numbers.f("roseate: warning: %d sample%s reached full scale (%.4g V) and %s; see the counts below",
                    clipped, clipped == 1 ? "" : "s", fsVolts, encoding == SampleEncoding.FLOAT_32 ? "lie beyond ±1.0 in the float file"
                            : "were clipped"));
            err.flush();
        }
        if (cmd.format == RenderCommand.Format.json) {
            out.print(json(render, e, rec, volts, file, fsVolts, clipped));
        } else {
            out.print(table(e, rec, volts, file, fsVolts, clipped));
        }
        out.flush();
        return 0;
    }

    private String encodingLabel() {
        return encoding == SampleEncoding.FLOAT_32 ? "32-bit float" : encoding.bitsPerSample() + "-bit PCM with TPDF dither";
    }

    /** The smallest full scale, V, whose expected count of samples beyond it is below {@link #SUGGESTED_EXPECTED_OVERS}. */
    static double suggestedFullScale(double rmsV, long samples) {
        double lo = rmsV;
        double hi = 40 * rmsV;
        for (int i = 0; i < 100; i++) {
            double mid = 0.5 * (lo + hi);
            if (samples * Gaussian.exceedanceProbability(mid, rmsV) < SUGGESTED_EXPECTED_OVERS) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        return hi;
    }

    private String table(VoltsRender.Expectation e, RecordStatistics r, SignalStatistics v, SignalStatistics file,
            double fsVolts, long clipped) {
        StringBuilder sb = new StringBuilder();
        BudgetResult b = e.budget();
        sb.append(Numbers.f("%nIn volts (channel 1)        %12s   %-34s %s%n", "this record", "expected for this record (± 1σ)",
                "budget over the band"));
        sb.append(Numbers.f("  RMS                       %12.4g V %-34s %.4g V%n", r.rmsV(),
                Numbers.f("%.4g V ± %.2g", e.rmsV(), e.rmsSigmaV()), b.outputRmsV()));
        sb.append(Numbers.f("  rate of change            %12.4g V/s %-32s %.4g V/s%n", r.sampledRateRmsVPerS(),
                Numbers.f("%.4g V/s ± %.2g", e.sampledRateRmsVPerS(), e.sampledRateSigmaVPerS()), b.rateRmsVPerS()));
        sb.append(Numbers.f("  zero crossings            %12.4g /s %-33s %.4g /s (Rice)%n", r.crossingsPerS(),
                Numbers.f("%.4g /s (record ± %.2g)", e.sampledCrossingsPerS(), r.crossingsStandardErrorPerS()), b.zeroCrossingsPerS()));
        sb.append(Numbers.f("  of the expected RMS: source %.4g V, circuit's own %.3g V%n", e.sourceRmsV(), e.selfNoiseRmsV()));
        sb.append(Numbers.f("  mean %+.4g V, peak %.4g V%n", v.mean(), v.peak()));
        StringBuilder p = new StringBuilder("  percentiles:");
        for (double q : RenderCommand.PERCENTILES) {
            p.append(Numbers.f("  %s%%: %+.4g V", q == (long) q ? Long.toString((long) q) : Double.toString(q), v.percentile(q)));
        }
        sb.append(p).append('\n');
        if (!csv && cmd.voltsPerFs == null) {
            sb.append(Numbers.f("Level: %.2f dBFS RMS (requested %.2f), peak %.2f dBFS, crest factor %.2f dB; %d clipped sample%s%n",
                    file.rmsDbfs(), cmd.levelDbfs, file.peakDbfs(), file.crestFactorDb(), clipped, clipped == 1 ? "" : "s"));
        } else if (!csv) {
            sb.append(Numbers.f("File: %.2f dBFS RMS, peak %.2f dBFS (full scale %.4g V); %d sample%s at or beyond full scale%n",
                    file.rmsDbfs(), file.peakDbfs(), fsVolts, clipped, clipped == 1 ? "" : "s"));
        }
        sb.append("Expected for this record: the density the file holds (the digital model's response, the source as"
                + " generated, the own noise as synthesised) over 0 Hz to fs/2; the rate is the first difference × fs and"
                + " the crossings are sign changes between samples, fs·arccos(ρ₁)/π for a Gaussian signal; ± is one"
                + " standard deviation of one record ((1/T)·∫S² df for a mean square; the crossings' from 16 segments of"
                + " this record). The budget's figures are the analog circuit's over the rendered band; they differ from"
                + " the expectation by the digital model's fidelity (±0.1 dB per third-octave band) and by what lies"
                + " outside the band.\n");
        sb.append("Wrote ").append(cmd.output).append('\n');
        return sb.toString();
    }

    private String json(VoltsRender render, VoltsRender.Expectation e, RecordStatistics r, SignalStatistics v, SignalStatistics file,
            double fsVolts, long clipped) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = m.createObjectNode();
        root.put("output", cmd.output.toString());
        root.put("source", cmd.design.getFileName().toString());
        root.put("unit", "volts");
        root.put("sampleRateHz", rateHz);
        root.put("frames", frames);
        root.put("seconds", frames / rateHz);
        root.put("channels", cmd.channels);
        root.put("encoding", csv ? "csv" : cmd.bits);
        if (!csv) {
            root.put("voltsPerFs", fsVolts);
            root.put("levelDbfs", file.rmsDbfs());
            root.put("peakDbfs", file.peakDbfs());
            root.put("clippedSamples", clipped);
        }
        root.put("oversamplingFactor", render.fidelity().factor());
        root.put("fidelityToleranceDb", org.roseate.noise.NoiseChain.FIDELITY_TOLERANCE_DB);
        Fidelity.json(render.fidelity(), org.roseate.noise.NoiseChain.FIDELITY_TOLERANCE_DB, root.putArray("fidelity"));
        ArrayNode band = root.putArray("rangeHz");
        band.add(e.fLowHz());
        band.add(e.fTopHz());
        ObjectNode rec = root.putObject("record");
        rec.put("rmsV", r.rmsV());
        rec.put("rateRmsVPerS", r.sampledRateRmsVPerS());
        rec.put("zeroCrossingsPerS", r.crossingsPerS());
        rec.put("zeroCrossingsStandardErrorPerS", r.crossingsStandardErrorPerS());
        rec.put("meanV", v.mean());
        rec.put("peakV", v.peak());
        ObjectNode pct = rec.putObject("percentilesV");
        for (double q : RenderCommand.PERCENTILES) {
            pct.put(q == (long) q ? Long.toString((long) q) : Double.toString(q), v.percentile(q));
        }
        ObjectNode ex = root.putObject("expected");
        ex.put("outputRmsV", e.rmsV());
        ex.put("outputRmsSigmaV", e.rmsSigmaV());
        ex.put("sourceRmsV", e.sourceRmsV());
        ex.put("selfNoiseRmsV", e.selfNoiseRmsV());
        ex.put("rateRmsVPerS", e.rateRmsVPerS());
        ex.put("sampledRateRmsVPerS", e.sampledRateRmsVPerS());
        ex.put("sampledRateSigmaVPerS", e.sampledRateSigmaVPerS());
        ex.put("zeroCrossingsPerS", e.zeroCrossingsPerS());
        ex.put("sampledZeroCrossingsPerS", e.sampledCrossingsPerS());
        ObjectNode bud = root.putObject("budget");
        bud.put("outputRmsV", e.budget().outputRmsV());
        bud.put("sourceRmsV", e.budget().sourceRmsV());
        bud.put("selfNoiseRmsV", e.budget().selfNoiseRmsV());
        bud.put("rateRmsVPerS", e.budget().rateRmsVPerS());
        bud.put("zeroCrossingsPerS", e.budget().zeroCrossingsPerS());
        try {
            return m.writeValueAsString(root) + System.lineSeparator();
        } catch (com.fasterxml.jackson.core.JsonProcessingException x) {
            throw new IllegalStateException("JSON of plain numbers cannot fail", x);
        }
    }
}
