package org.roseate.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.diagnose.CaptureDiagnosis;
import org.roseate.diagnose.CaptureResponses;
import org.roseate.diagnose.Diagnosis;
import org.roseate.diagnose.DiagnosisException;
import org.roseate.diagnose.FitPoint;
import org.roseate.diagnose.MeasuredResponse;
import org.roseate.diagnose.MissingToleranceException;
import org.roseate.diagnose.PartEstimate;
import org.roseate.diagnose.PartPrior;
import org.roseate.plot.FrequencyChart;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.CalibrationException;
import org.roseate.value.ComponentKind;
import org.roseate.value.EngineeringValue;
import org.roseate.value.Tolerance;
import org.roseate.value.ValueFormatException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code diagnose DESIGN.json CAPTURE.wav}: each part's actual value, estimated from a measured build. */
@Command(name = "diagnose", mixinStandardHelpOptions = true,
        description = "Estimate every part's actual value from a capture of the built circuit: a transfer capture "
                + "(with --reference-channel) or a noise-source capture (one channel, level unknown).")
final class DiagnoseCommand implements Callable<Integer> {
    static final String LEGEND = "Method: maximum a posteriori estimate of ln(value) per part; the measured level's "
            + "scatter per point weights the fit, and each part's tolerance is a prior (the tolerance spans ±"
            + (int) PartPrior.K_SIGMA + "σ, plus a " + (int) Math.round(PartPrior.WRONG_PART_PROBABILITY * 100)
            + " %% chance of a wrong part); Levenberg–Marquardt. Interval: central %s from the posterior covariance. "
            + "P(outside): posterior probability that the part lies outside its tolerance; flagged at %s and above.";

    enum Format { table, json, csv }

    @Parameters(index = "0", paramLabel = "DESIGN.json", description = "the design as drawn")
    Path designFile;

    @Parameters(index = "1", arity = "0..1", paramLabel = "CAPTURE.wav", description = "the capture (or --live)")
    Path file;

    @Option(names = "--reference-channel", paramLabel = "N",
            description = "transfer capture: the channel carrying the test signal at the circuit's input, from 1")
    Integer referenceChannel;

    @Option(names = "--channel", paramLabel = "N",
            description = "the channel at the circuit's output, from 1 (default: 1, or the other of two with --reference-channel)")
    Integer channel;

    @Option(names = "--tolerance", paramLabel = "R=1%,C=5%",
            description = "tolerances per kind letter or designator, over the design's own")
    String tolerance;

    @Option(names = "--calibration", paramLabel = "cal.json", description = "divide out a loopback calibration")
    Path calibration;

    @Option(names = "--format", defaultValue = "table", description = "table, json or csv (default: ${DEFAULT-VALUE})")
    Format format;

    @Option(names = "--plot", paramLabel = "FILE.png|FILE.svg", description = "draw measured, fitted and design curves and the residual")
    Path plot;

    @Option(names = "--force", description = "replace an existing --plot or --save-capture file")
    boolean force;

    @Option(names = "--segment", paramLabel = "N", description = "FFT segment length (default: from the design's lowest corner)")
    Integer segment;

    @Option(names = "--live", description = "record from line-in first (with --reference-channel, playing white test noise)")
    boolean live;

    @Option(names = "--device", paramLabel = "NAME|INDEX", description = "with --live: input device")
    String device;

    @Option(names = "--output-device", paramLabel = "NAME|INDEX", description = "with --live and --reference-channel: output device")
    String outputDevice;

    @Option(names = "--rate", defaultValue = "48000", description = "with --live: sample rate in Hz (default: ${DEFAULT-VALUE})")
    int rateHz;

    @Option(names = "--seconds", defaultValue = "30", description = "with --live: recording length (default: ${DEFAULT-VALUE})")
    double seconds;

    @Option(names = "--level", defaultValue = "-20", paramLabel = "DBFS",
            description = "with --live and --reference-channel: RMS level of the test noise (default: ${DEFAULT-VALUE}; above -10 needs --allow-loud)")
    double levelDbfs;

    @Option(names = "--allow-loud", description = "allow a test-noise level above -10 dBFS")
    boolean allowLoud;

    @Option(names = "--save-capture", paramLabel = "OUT.wav", description = "with --live: keep the raw recording")
    Path saveCapture;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        if (live) {
            if (file != null) {
                throw new UserInputException("diagnose: give a capture or --live, not both");
            }
            file = LiveCapture.record(liveSettings(), spec.commandLine().getErr());
        } else if (file == null) {
            throw new UserInputException("diagnose: name the capture, or record one with --live");
        } else if (saveCapture != null) {
            throw new UserInputException("--save-capture applies to --live only");
        }
        try {
            return run();
        } finally {
            if (live && saveCapture == null) {
                LiveCapture.deleteTemporary(file, spec.commandLine().getErr());
            }
        }
    }

    /** The recording settings as {@code measure --live} takes them, so both record the same way. */
    private LiveCapture.Request liveSettings() {
        boolean transfer = referenceChannel != null;
        return new LiveCapture.Request(device, outputDevice, rateHz, seconds, levelDbfs, allowLoud, transfer,
                transfer ? null : channel, saveCapture, force);
    }

    private String name() {
        return file.getFileName().toString();
    }

    private Integer run() {
        CompareCommand.checkPlotName(plot);
        Design design = DesignReader.read(designFile);
        String source = designFile.getFileName().toString();
        Calibration cal = null;
        if (calibration != null) {
            try {
                cal = Calibration.read(calibration);
            } catch (CalibrationException e) {
                throw new UserInputException(e.getMessage());
            }
        }
        CaptureDiagnosis.Outcome o;
        try {
            o = CaptureDiagnosis.run(new CaptureDiagnosis.Request(design, source, file, referenceChannel, channel,
                    tolerances(), cal, segment));
        } catch (MissingToleranceException e) {
            throw new UserInputException(source + ": no tolerance for " + String.join(", ", e.designators())
                    + "; give them with --tolerance R=1%,C=5%");
        } catch (DiagnosisException e) {
            throw new UserInputException(e.getMessage());
        }
        MeasuredResponse measured = o.measured();
        Diagnosis dx = o.diagnosis();
        int n = o.segmentLength();
        if (plot != null) {
            CompareCommand.writePlot(chart(dx), plot, force);
        }
        String out = switch (format) {
            case json -> json(design, measured, dx, n);
            case csv -> csv(design, dx);
            default -> table(design, measured, dx, n, o.bandHz());
        };
        PrintWriter pw = spec.commandLine().getOut();
        pw.print(out);
        pw.flush();
        return 0;
    }

    /** Parses --tolerance "R=1%,C=5%,R3=0.1%". */
    private Map<String, Tolerance> tolerances() {
        Map<String, Tolerance> map = new LinkedHashMap<>();
        if (tolerance == null) {
            return map;
        }
        for (String item : tolerance.split(",")) {
            int eq = item.indexOf('=');
            String key = eq < 0 ? "" : item.substring(0, eq).trim();
            if (eq < 0 || !key.matches("[RCL][0-9]*")) {
                throw new UserInputException("--tolerance: expected entries such as R=1%,C=5% or R3=0.1%, found '"
                        + item.trim() + "'");
            }
            try {
                map.put(key, Tolerance.parse(item.substring(eq + 1)));
            } catch (ValueFormatException e) {
                throw new UserInputException("--tolerance " + key + ": " + e.getMessage());
            }
        }
        return map;
    }

    private static ComponentKind kind(Design d, String designator) {
        return d.component(designator).orElseThrow().kind();
    }

    /** A value for humans, to four significant digits: 47.02 kΩ. */
    private static String si(double v, ComponentKind kind) {
        return EngineeringValue.formatSi(Double.parseDouble(Numbers.f("%.4g", v)), kind);
    }

    private static String percent(double confidence) {
        return Numbers.f("%.0f %%", confidence * 100);
    }

    private String table(Design design, MeasuredResponse m, Diagnosis dx, int n, double[] band) {
        StringBuilder sb = new StringBuilder();
        sb.append(Numbers.f("Design:  %s (%s), %d parts%n", design.name(), designFile.getFileName(), dx.parts().size()));
        sb.append(Numbers.f("Capture: %s, %s, %s; segment %d (%.4g Hz bins)%n", name(), Numbers.hz(m.sampleRateHz()),
                m.description(), n, m.sampleRateHz() / n));
        sb.append(Numbers.f("Analysed %s to %s, %d points per decade; %d of %d points trusted%s%n", Numbers.hz(band[0]),
                Numbers.hz(band[1]), CaptureResponses.POINTS_PER_DECADE, m.trustedCount(), m.size(),
                m.levelFree() ? Numbers.f("; level fitted: %+.2f dB", dx.levelOffsetDb())
                        : Numbers.f(" (coherence ≥ %.2f)", CaptureResponses.COHERENCE_THRESHOLD)));
        String interval = percent(dx.confidence()) + " interval";
        sb.append(Numbers.f("%n%-6s %11s %11s %9s  %-25s %6s %10s%n", "part", "nominal", "estimate", "change", interval,
                "tol", "P(outside)"));
        for (PartEstimate p : dx.parts()) {
            ComponentKind k = kind(design, p.designator());
            sb.append(Numbers.f("%-6s %11s %11s %+8.2f%%  %-25s %5s %10.3f%s%n", p.designator(), si(p.nominal(), k),
                    si(p.estimate(), k), p.changePercent(), si(p.low(), k) + " … " + si(p.high(), k),
                    new Tolerance(p.tolerance()), p.probabilityOutside(), p.outOfTolerance() ? "  OUT OF TOLERANCE" : ""));
        }
        sb.append('\n');
        List<PartEstimate> flagged = dx.modelMisfit() ? List.of() : dx.flagged();
        if (dx.modelMisfit()) {
            sb.append("No part values explain this measurement (see the residual below), so no part is named to change.\n");
        } else if (flagged.isEmpty()) {
            sb.append(Numbers.f("No part is outside its tolerance at %s confidence.%n", percent(dx.confidence())));
        }
        for (PartEstimate p : flagged) {
            ComponentKind k = kind(design, p.designator());
            sb.append(Numbers.f("Change %s: it measures %s (%s … %s), the design wants %s.%n", p.designator(),
                    si(p.estimate(), k), si(p.low(), k), si(p.high(), k), si(p.nominal(), k)));
        }
        if (dx.ambiguityGroups().isEmpty()) {
            sb.append("Ambiguity groups: none; the capture resolves every part better than its tolerance.\n");
        } else {
            List<String> g = new ArrayList<>();
            dx.ambiguityGroups().forEach(x -> g.add("{" + String.join(" ", x) + "}"));
            sb.append("Ambiguity groups (the capture cannot tell these changes apart better than the tolerances do): ")
                    .append(String.join(", ", g)).append('\n');
        }
        sb.append(Numbers.f("Residual: %.3f dB RMS over %d trusted points; %.3f dB expected from the measurement's scatter "
                + "(χ² = %.1f on %.1f degrees of freedom, p = %.3g)%n", dx.residualDb(), m.trustedCount(),
                dx.expectedResidualDb(), dx.chiSquare(), dx.degreesOfFreedom(), dx.misfitPValue()));
        if (dx.modelMisfit()) {
            sb.append("No part values explain this measurement: look for a missing, extra or swapped part or a wiring "
                    + "fault (see the residual per point below); the estimates above are not to be trusted.\n");
        }
        sb.append(Numbers.f("%n%12s %10s %10s %10s %10s %8s%n", "Hz", "measured", "fitted", "design", "residual", "±dB"));
        for (FitPoint p : dx.points()) {
            sb.append(Numbers.f("%12.3f %10.3f %10.3f %10.3f %+10.3f %8.3f%s%n", p.hz(), p.measuredDb(), p.fittedDb(),
                    p.designDb(), p.residualDb(), p.uncertaintyDb(), p.trusted() ? "" : " *"));
        }
        sb.append("\n* untrusted (coherence below the threshold): shown, not fitted.\n");
        sb.append(Numbers.f(LEGEND, percent(dx.confidence()), percent(dx.confidence()))).append('\n');
        return sb.toString();
    }

    private static void put(ObjectNode o, String key, double v) {
        if (Double.isFinite(v)) {
            o.put(key, v);
        } else {
            o.putNull(key);
        }
    }

    private String json(Design design, MeasuredResponse m, Diagnosis dx, int n) {
        ObjectMapper mapper = new ObjectMapper();
        ObjectNode root = mapper.createObjectNode();
        root.put("design", designFile.getFileName().toString());
        root.put("file", name());
        root.put("mode", m.levelFree() ? "noise" : "transfer");
        root.put("sampleRateHz", m.sampleRateHz());
        root.put("segmentLength", n);
        root.put("confidence", dx.confidence());
        root.put("toleranceSigmas", PartPrior.K_SIGMA);
        ArrayNode parts = root.putArray("parts");
        for (PartEstimate p : dx.parts()) {
            ObjectNode o = parts.addObject();
            o.put("designator", p.designator());
            o.put("nominal", p.nominal());
            o.put("estimate", p.estimate());
            o.put("low", p.low());
            o.put("high", p.high());
            o.put("outOfTolerance", p.outOfTolerance());
            o.put("tolerance", p.tolerance());
            o.put("probabilityOutside", p.probabilityOutside());
            o.put("unit", kind(design, p.designator()).unitSymbol());
        }
        ArrayNode groups = root.putArray("ambiguityGroups");
        for (List<String> g : dx.ambiguityGroups()) {
            ArrayNode a = groups.addArray();
            g.forEach(a::add);
        }
        put(root, "residualDb", dx.residualDb());
        put(root, "expectedResidualDb", dx.expectedResidualDb());
        put(root, "chiSquare", dx.chiSquare());
        put(root, "degreesOfFreedom", dx.degreesOfFreedom());
        put(root, "misfitPValue", dx.misfitPValue());
        root.put("modelMisfit", dx.modelMisfit());
        put(root, "levelOffsetDb", dx.levelOffsetDb());
        ArrayNode points = root.putArray("points");
        for (FitPoint p : dx.points()) {
            ObjectNode o = points.addObject();
            o.put("hz", p.hz());
            put(o, "measuredDb", p.measuredDb());
            put(o, "fittedDb", p.fittedDb());
            put(o, "designDb", p.designDb());
            put(o, "uncertaintyDb", p.uncertaintyDb());
            o.put("trusted", p.trusted());
        }
        root.put("legend", Numbers.f(LEGEND, percent(dx.confidence()), percent(dx.confidence())));
        try {
            return mapper.enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(root) + "\n";
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    private static String csv(Design design, Diagnosis dx) {
        StringBuilder sb = new StringBuilder("designator,unit,nominal,estimate,low,high,tolerance,probabilityOutside,outOfTolerance\n");
        for (PartEstimate p : dx.parts()) {
            sb.append(p.designator()).append(',').append(kind(design, p.designator()).unitSymbol()).append(',')
                    .append(Numbers.plain(p.nominal())).append(',').append(Numbers.plain(p.estimate())).append(',')
                    .append(Numbers.plain(p.low())).append(',').append(Numbers.plain(p.high())).append(',')
                    .append(Numbers.plain(p.tolerance())).append(',').append(Numbers.plain(p.probabilityOutside()))
                    .append(',').append(p.outOfTolerance()).append('\n');
        }
        return sb.toString();
    }

    private FrequencyChart chart(Diagnosis dx) {
        List<FitPoint> t = dx.points().stream().filter(FitPoint::trusted).toList();
        double[] hz = t.stream().mapToDouble(FitPoint::hz).toArray();
        double[] measured = t.stream().mapToDouble(FitPoint::measuredDb).toArray();
        double[] fitted = t.stream().mapToDouble(FitPoint::fittedDb).toArray();
        double[] designDb = t.stream().mapToDouble(FitPoint::designDb).toArray();
        double[] residual = t.stream().mapToDouble(FitPoint::residualDb).toArray();
        double[] u = t.stream().mapToDouble(FitPoint::uncertaintyDb).toArray();
        double[] minus = Arrays.stream(u).map(x -> -x).toArray();
        FrequencyChart.Panel levels = new FrequencyChart.Panel("level (dB)", List.of(
                new FrequencyChart.Curve("measured", hz, measured, false),
                new FrequencyChart.Curve("fitted", hz, fitted, false),
                new FrequencyChart.Curve("design", hz, designDb, true)), List.of(), List.of());
        FrequencyChart.Panel res = new FrequencyChart.Panel("measured − fitted (dB)", List.of(
                new FrequencyChart.Curve("residual", hz, residual, false),
                new FrequencyChart.Curve("+1σ", hz, u, true),
                new FrequencyChart.Curve("−1σ", hz, minus, true)), List.of(), List.of());
        return new FrequencyChart("Diagnosis of " + name(), List.of(levels, res));
    }
}
