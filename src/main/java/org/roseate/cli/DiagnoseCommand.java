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
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.diagnose.CaptureDiagnosis;
import org.roseate.diagnose.CaptureGrid;
import org.roseate.diagnose.Diagnoser;
import org.roseate.diagnose.Diagnosis;
import org.roseate.diagnose.DiagnosisException;
import org.roseate.diagnose.FitPoint;
import org.roseate.diagnose.MeasuredResponse;
import org.roseate.diagnose.MissingToleranceException;
import org.roseate.diagnose.PartEstimate;
import org.roseate.diagnose.PartPrior;
import org.roseate.diagnose.SensitivityBand;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;
import org.roseate.measure.MeasureRequest;
import org.roseate.plot.FrequencyChart;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.CalibrationException;
import org.roseate.sweep.SweepResult;
import org.roseate.value.ComponentKind;
import org.roseate.value.EngineeringValue;
import org.roseate.value.Tolerance;
import org.roseate.value.ValueFormatException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code diagnose DESIGN.json CAPTURE.wav}: each part's actual value, estimated from a measured build. */
@Command(name = "diagnose", mixinStandardHelpOptions = true,
        description = "Estimate every part's actual value from a capture of the built circuit: a transfer capture "
                + "(with --reference-channel; noise or, with --sweep, a swept sine) or a noise-source capture (one "
                + "channel, level unknown).")
final class DiagnoseCommand implements Callable<Integer> {
    static final String LEGEND = "Method: maximum a posteriori estimate of ln(value) per part; the measured level's "
            + "scatter per point weights the fit, and each part's tolerance is a prior (the tolerance spans ±"
            + (int) PartPrior.K_SIGMA + "σ, plus a " + (int) Math.round(PartPrior.WRONG_PART_PROBABILITY * 100)
            + " %% chance of a wrong part); transfer captures fit magnitude and phase, each weighted by its own "
            + "uncertainty; Levenberg–Marquardt. Interval: central %s from the posterior covariance. "
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

    @Mixin
    SweepOptions sweep = new SweepOptions();

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        if (sweep.enabled()) {
            return sweepDiagnosis();
        }
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

    /** The design, its parts' priors and where each part shapes the response. */
    private record Parts(Design design, String source, List<PartPrior> priors, List<SensitivityBand> bands) {
    }

    private Parts parts() {
        CompareCommand.checkPlotName(plot);
        Design design = DesignReader.read(designFile);
        String source = designFile.getFileName().toString();
        List<PartPrior> priors;
        try {
            priors = PartPrior.of(design, tolerances());
        } catch (MissingToleranceException e) {
            throw new UserInputException(source + ": no tolerance for " + String.join(", ", e.designators())
                    + "; give them with --tolerance R=1%,C=5%");
        }
        return new Parts(design, source, priors, SensitivityBand.of(design, source, priors));
    }

    private Integer run() {
        Parts parts = parts();
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
            o = CaptureDiagnosis.run(new CaptureDiagnosis.Request(parts.design(), parts.source(), file,
                    referenceChannel, channel, tolerances(), cal, segment));
        } catch (DiagnosisException e) {
            throw new UserInputException(e.getMessage());
        }
        PrintWriter err = spec.commandLine().getErr();
        // Only the warnings about the samples themselves: the core's band table is not shown here.
        o.warnings().forEach(w -> err.println("roseate: " + w));
        err.flush();
        int n = o.segmentLength();
        return print(parts, o.measured(), o.diagnosis(), Numbers.f("segment %d (%.4g Hz bins)", n,
                o.measured().sampleRateHz() / n), o.bandHz(), n);
    }

    /** {@code --sweep}: a swept-sine transfer capture, from a file or live, read as {@code measure --sweep} reads it. */
    private Integer sweepDiagnosis() {
        String[] noiseOnly = {"--calibration", "--segment", "--save-capture"};
        for (String option : noiseOnly) {
            if (spec.commandLine().getParseResult().hasMatchedOption(option)) {
                throw new UserInputException(option + " does not apply to --sweep captures");
            }
        }
        if (live == (file != null)) {
            throw new UserInputException(live ? "--live records its own capture; leave out " + file
                    : "diagnose: name the capture, or record one with --live");
        }
        if (referenceChannel == null) {
            throw new UserInputException("--sweep diagnoses a transfer capture; name the reference with --reference-channel N");
        }
        Parts parts = parts();
        double rate = rateHz;
        int channels = 2;
        if (!live) {
            try (WavReader reader = open()) {
                rate = reader.format().sampleRateHz();
                channels = reader.format().channels();
            } catch (WavFormatException e) {
                throw new UserInputException(e.getMessage());
            } catch (IOException e) {
                throw new UserInputException(name() + ": cannot read (" + e.getMessage() + ")");
            }
        }
        if (!live && channels < 2) {
            throw new UserInputException(file + ": --reference-channel needs two channels; the file has 1");
        }
        // live: the input is opened with as many channels as the two named need
        int avail = live ? Math.max(channels, Math.max(referenceChannel, channel == null ? 0 : channel)) : channels;
        int ref = index(referenceChannel, "--reference-channel", avail);
        int resp;
        if (channel != null) {
            resp = index(channel, "--channel", avail);
        } else if (channels == 2) {
            resp = 1 - ref;
        } else {
            throw new UserInputException(file + ": has " + channels + " channels; name the response with --channel");
        }
        try {
            CaptureDiagnosis.checkRate(file == null ? "live recording" : file.toString(), rate, parts.bands());
        } catch (DiagnosisException e) {
            throw new UserInputException(e.getMessage());
        }
        PrintWriter err = spec.commandLine().getErr();
        SweepResult r = SweepMeasurement.measure(file, sweep, live, resp, ref, outputDevice, device, rateHz, levelDbfs,
                allowLoud, err);
        err.flush();
        double[] band = {r.spec().startHz(), Math.min(CaptureGrid.HIGH_FRACTION_OF_RATE * rate,
                Math.min(r.spec().endHz(), SensitivityBand.GRID_HIGH_HZ))};
        for (SensitivityBand b : parts.bands()) {
            if (!b.seenWithin(band[0], band[1])) {
                throw new UserInputException(Numbers.f("%s: the sweep covers %s to %s, but %s shapes the response only "
                        + "from %s to %s; widen --sweep-from/--sweep-to", sweepName(), Numbers.hz(band[0]),
                        Numbers.hz(band[1]), b.designator(), Numbers.hz(b.fromHz()), Numbers.hz(b.toHz())));
            }
        }
        MeasuredResponse measured;
        try {
            measured = MeasuredResponse.of(r, band[0], band[1], Numbers.f("swept sine %s to %s, %.3g s, transfer from "
                    + "channel %d (reference) to channel %d", Numbers.hz(r.spec().startHz()), Numbers.hz(r.spec().endHz()),
                    r.spec().durationSeconds(), ref + 1, resp + 1));
        } catch (IllegalArgumentException e) {
            throw new UserInputException(sweepName() + ": " + e.getMessage());
        }
        return report(parts, measured, Numbers.f("%d points per octave", sweep.pointsPerOctave()), band, 0);
    }

    private String sweepName() {
        return file == null ? "live recording" : name();
    }

    /** Diagnoses a swept-sine response and prints in the chosen form. */
    private Integer report(Parts parts, MeasuredResponse measured, String resolution, double[] band, int n) {
        Diagnosis dx;
        try {
            CaptureDiagnosis.checkTrusted(sweepName(), measured, true);
            dx = Diagnoser.diagnose(parts.design(), parts.source(), parts.priors(), measured, Diagnoser.DEFAULT_CONFIDENCE);
        } catch (DiagnosisException e) {
            throw new UserInputException(e.getMessage().startsWith(sweepName()) ? e.getMessage()
                    : sweepName() + ": " + e.getMessage());
        }
        return print(parts, measured, dx, resolution, band, n);
    }

    /** Prints a diagnosis in the chosen form, and draws it when --plot asks. */
    private Integer print(Parts parts, MeasuredResponse measured, Diagnosis dx, String resolution, double[] band, int n) {
        if (plot != null) {
            CompareCommand.writePlot(chart(dx), plot, force);
        }
        String out = switch (format) {
            case json -> json(parts.design(), measured, dx, n);
            case csv -> csv(parts.design(), dx);
            default -> table(parts.design(), measured, dx, resolution, band);
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

    private WavReader open() throws IOException {
        if (file == null) {
            throw new UserInputException("diagnose: name the capture, or record one with --live");
        }
        if (Files.isDirectory(file)) {
            throw new UserInputException(file + ": is a folder, not a WAV file");
        }
        try {
            return WavReader.open(file);
        } catch (NoSuchFileException e) {
            throw new UserInputException(file + ": no such file");
        } catch (AccessDeniedException e) {
            throw new UserInputException(file + ": permission denied");
        }
    }

    private int index(int oneBased, String option, int channels) {
        if (oneBased < 1 || oneBased > channels) {
            throw new UserInputException(file + ": " + option + " " + oneBased + " is out of range; the file has "
                    + channels + (channels == 1 ? " channel" : " channels"));
        }
        return oneBased - 1;
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

    private String table(Design design, MeasuredResponse m, Diagnosis dx, String resolution, double[] band) {
        StringBuilder sb = new StringBuilder();
        sb.append(Numbers.f("Design:  %s (%s), %d parts%n", design.name(), designFile.getFileName(), dx.parts().size()));
        sb.append(Numbers.f("Capture: %s, %s, %s; %s%n", sweepName(), Numbers.hz(m.sampleRateHz()), m.description(),
                resolution));
        sb.append(Numbers.f("Analysed %s to %s, %d points; %d trusted%s%s%n", Numbers.hz(band[0]), Numbers.hz(band[1]),
                m.size(), m.trustedCount(), m.levelFree() ? Numbers.f("; level fitted: %+.2f dB", dx.levelOffsetDb())
                        : sweep.enabled() ? " (noise below half the signal)"
                        : Numbers.f(" (coherence ≥ %.2f)", MeasureRequest.DEFAULT_COHERENCE_THRESHOLD),
                dx.phasePoints() > 0 ? Numbers.f("; magnitude and phase fitted (%d phases)", dx.phasePoints())
                        : "; magnitude fitted (no phase)"));
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
        if (dx.phasePoints() > 0) {
            sb.append(Numbers.f("Phase residual: %.3f° RMS over %d points%n", dx.residualDeg(), dx.phasePoints()));
        }
        if (dx.modelMisfit()) {
            sb.append("No part values explain this measurement: look for a missing, extra or swapped part or a wiring "
                    + "fault (see the residual per point below); the estimates above are not to be trusted.\n");
        }
        boolean phase = dx.phasePoints() > 0;
        sb.append(Numbers.f("%n%12s %10s %10s %10s %10s %8s%s%n", "Hz", "measured", "fitted", "design", "residual", "±dB",
                phase ? Numbers.f(" %9s %9s %8s", "meas. °", "resid. °", "±°") : ""));
        for (FitPoint p : dx.points()) {
            sb.append(Numbers.f("%12.3f %10.3f %10.3f %10.3f %+10.3f %8.3f%s%s%n", p.hz(), p.measuredDb(), p.fittedDb(),
                    p.designDb(), p.residualDb(), p.uncertaintyDb(), !phase ? "" : Double.isFinite(p.measuredDeg())
                            ? Numbers.f(" %9.2f %+9.3f %8.3f", p.measuredDeg(), p.residualDeg(), p.uncertaintyDeg())
                            : Numbers.f(" %9s %9s %8s", "", "", ""), p.trusted() ? "" : " *"));
        }
        sb.append(sweep.enabled() ? "\n* untrusted (the sweep's noise above half the signal): shown, not fitted.\n"
                : "\n* untrusted (coherence below the threshold): shown, not fitted.\n");
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
        root.put("file", sweepName());
        root.put("mode", m.levelFree() ? "noise" : "transfer");
        root.put("stimulus", sweep.enabled() ? "sweep" : "noise");
        root.put("sampleRateHz", m.sampleRateHz());
        if (n > 0) {
            root.put("segmentLength", n);
        }
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
        put(root, "residualDeg", dx.residualDeg());
        root.put("phasePoints", dx.phasePoints());
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
            if (Double.isFinite(p.measuredDeg())) {
                put(o, "measuredDeg", p.measuredDeg());
                put(o, "fittedDeg", p.fittedDeg());
                put(o, "designDeg", p.designDeg());
                put(o, "uncertaintyDeg", p.uncertaintyDeg());
            }
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
        List<FitPoint> ph = t.stream().filter(x -> Double.isFinite(x.measuredDeg())).toList();
        if (ph.isEmpty()) {
            return new FrequencyChart("Diagnosis of " + sweepName(), List.of(levels, res));
        }
        double[] phz = ph.stream().mapToDouble(FitPoint::hz).toArray();
        double[] pres = ph.stream().mapToDouble(FitPoint::residualDeg).toArray();
        double[] pu = ph.stream().mapToDouble(FitPoint::uncertaintyDeg).toArray();
        double[] pminus = Arrays.stream(pu).map(x -> -x).toArray();
        FrequencyChart.Panel phase = new FrequencyChart.Panel("measured − fitted phase (°)", List.of(
                new FrequencyChart.Curve("phase residual", phz, pres, false),
                new FrequencyChart.Curve("+1σ", phz, pu, true),
                new FrequencyChart.Curve("−1σ", phz, pminus, true)), List.of(), List.of());
        return new FrequencyChart("Diagnosis of " + sweepName(), List.of(levels, res, phase));
    }
}
