package org.roseate.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.Callable;
import org.roseate.bands.BandFraction;
import org.roseate.budget.BudgetResult;
import org.roseate.budget.NoiseBudget;
import org.roseate.budget.SourceFit;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.LogGrid;
import org.roseate.plot.FrequencyChart;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code budget DESIGN.json}: what the circuit really puts out, in volts. */
@Command(name = "budget", mixinStandardHelpOptions = true,
        description = "Noise budget in volts: output density and band levels (dBV), output RMS split into the "
                + "source's part and the circuit's own, each stage's RMS against its op-amp's swing (headroom, "
                + "clip probability) and slew rate, the output's rate of change and zero-crossing rate, and every "
                + "noise contributor ranked.")
final class BudgetCommand implements Callable<Integer> {
    static final String LEGEND = "RMS: √∫S df over the range, S the one-sided density in V²/Hz; generators "
            + "uncorrelated, so powers add. Headroom: 20·log10(swing/RMS). Clip probability: P(|v| > swing) for a "
            + "Gaussian voltage of that RMS, erfc(swing/(√2·RMS)). Slew: RMS rate of change √∫(2πf)²S df; 4σ is "
            + "exceeded about 6e-5 of the time. Zero crossings: Rice's expected rate (1/π)·√(∫(2πf)²S df/∫S df). "
            + "Stages drive each other through ideal buffers; a stage's input source has no impedance.";

    enum Format { table, json, csv }

    @Parameters(index = "0", paramLabel = "DESIGN.json", description = "design file (with \"source\" for the source's part)")
    Path file;

    @Option(names = "--range", defaultValue = "20-20000", paramLabel = "LO-HI", description = "frequency range in Hz (default: ${DEFAULT-VALUE})")
    String range;

    @Option(names = "--bands", defaultValue = "third", paramLabel = "octave|third", description = "band width (default: ${DEFAULT-VALUE})")
    String bands;

    @Option(names = "--freqs", paramLabel = "F1,F2,…", description = "density points in Hz (default: 10 per decade over the range)")
    String freqs;

    @Option(names = "--format", defaultValue = "table", description = "table, json or csv (default: ${DEFAULT-VALUE}); "
            + "csv holds the band levels, or the density at --freqs")
    Format format;

    @Option(names = "--plot", paramLabel = "FILE.png|FILE.svg", description = "also draw the output density and band levels")
    Path plot;

    @Option(names = "--force", description = "replace an existing plot file")
    boolean force;

    @Option(names = "--source-capture", paramLabel = "SOURCE.wav", description = "a capture of the bare noise source: "
            + "d and the 1/f corner are fitted to its density and replace the design's \"source\"")
    Path sourceCapture;

    @Option(names = "--volts-per-fs", paramLabel = "V", description = "with --source-capture: volts at the capture's full scale")
    Double voltsPerFs;

    @Option(names = "--calibration", paramLabel = "cal.json", description = "with --source-capture: a calibration made by "
            + "'measure --save-calibration' (its volts per full scale, and its loopback response divided out)")
    Path calibration;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** The source fitted to --source-capture, or null. */
    private SourceFit.Result fit;

    @Override
    public Integer call() {
        FrequencyRange r = BandOptions.analysableRange(range);
        BandFraction fraction = BandOptions.fraction(bands);
        double[] points = freqs == null ? LogGrid.points(r.loHz(), r.hiHz(), 10) : Inputs.frequencies(freqs, "--freqs");
        CompareCommand.checkPlotName(plot);
        if (sourceCapture == null && (voltsPerFs != null || calibration != null)) {
            throw new UserInputException((voltsPerFs != null ? "--volts-per-fs" : "--calibration")
                    + " needs --source-capture: it scales the capture of the bare source");
        }
        Design design = DesignReader.read(file);
        SourceFit.Result fitted = null;
        if (sourceCapture != null) {
            fitted = SourceCapture.fit(sourceCapture, voltsPerFs, calibration, spec.commandLine().getErr());
            design = design.withSource(java.util.Optional.of(fitted.source()), design.temperatureC());
        }
        this.fit = fitted;
        NoiseBudget budget = NoiseBudget.of(design, file.getFileName().toString());
        BudgetResult res = budget.compute(r.loHz(), r.hiHz(), points, fraction);
        if (!(res.outputRmsV() > 0)) {
            throw new UserInputException(file.getFileName() + ": nothing makes noise: the design has no \"source\", and "
                    + "no resistors or op-amp noise keys (enVPerRtHz, inAPerRtHz)");
        }
        PrintWriter out = spec.commandLine().getOut();
        switch (format) {
            case json -> out.print(json(design, res, fit, sourceCapture));
            case csv -> out.print(freqs == null ? bandsCsv(res) : densityCsv(res));
            default -> out.print(table(design, res));
        }
        out.flush();
        if (plot != null) {
            CompareCommand.writePlot(chart(design, budget, res), plot, force);
        }
        return 0;
    }

    private String table(Design d, BudgetResult r) {
        StringBuilder sb = new StringBuilder();
        sb.append("Design: ").append(d.name()).append(" (").append(file.getFileName()).append(")\n");
        sb.append(Numbers.f("Range: %s – %s, %d-point quadrature; temperature %.1f °C%n", Numbers.hz(r.loHz()),
                Numbers.hz(r.hiHz()), r.quadratureNodes(), r.temperatureC()));
        if (fit != null) {
            sb.append(SourceCapture.describe(sourceCapture, fit)).append('\n');
        } else {
            sb.append(d.source().map(s -> Numbers.f("Source: %s V/√Hz, 1/f corner %s Hz%n", volts(s.densityVPerRtHz()),
                    Numbers.plain(s.flickerCornerHz()))).orElse("Source: none in the design file (circuit's own noise only)\n"));
        }
        sb.append('\n');
        sb.append(Numbers.f("Output RMS:        %s V%n", volts(r.outputRmsV())));
        if (r.hasSource()) {
            sb.append(Numbers.f("  source's part:   %s V%n", volts(r.sourceRmsV())));
        }
        sb.append(Numbers.f("  circuit's own:   %s V%n", volts(r.selfNoiseRmsV())));
        r.sourceToSelfDb().ifPresent(db -> sb.append(Numbers.f("  source / own:    %.1f dB%n", db)));
        sb.append(Numbers.f("Rate of change:    %s V/s RMS%n", volts(r.rateRmsVPerS())));
        sb.append(Numbers.f("Zero crossings:    %s per second (Rice)%n%n", volts(r.zeroCrossingsPerS())));
        sb.append(Numbers.f("%-14s %11s %8s %9s %11s %12s %12s %10s%n", "stage", "RMS V", "swing V", "headroom", "P(clip)",
                "slew V/µs", "4σ V/µs", "limit"));
        for (BudgetResult.StageReading s : r.stages()) {
            String name = s.stage() + " " + s.node() + s.opamp().map(u -> " (" + u + ")").orElse("");
            sb.append(Numbers.f("%-14s %11s %8s %9s %11s %12s %12s %10s%n", name, volts(s.rmsV()),
                    s.swingV().map(Numbers::plain).orElse("–"), s.headroomDb().map(h -> Numbers.f("%.1f dB", h)).orElse("–"),
                    s.clipProbability().map(p -> p == 0 ? "< 1e-300" : Numbers.f("%.3g", p)).orElse("–"), volts(s.slewRmsVPerUs()),
                    volts(s.slew4SigmaVPerUs()), s.slewVPerUs().map(Numbers::plain).orElse("–")));
        }
        sb.append(Numbers.f("%nContributors at the output (ranked):%n%-20s %12s %8s%n", "name", "RMS V", "share"));
        double total2 = r.outputRmsV() * r.outputRmsV();
        for (BudgetResult.Contributor c : r.contributors()) {
            sb.append(Numbers.f("%-20s %12s %7.2f%%%n", c.name(), volts(c.rmsV()), 100 * c.rmsV() * c.rmsV() / total2));
        }
        sb.append(Numbers.f("%n%8s %11s %11s %9s%n", "band", "low Hz", "high Hz", "dBV"));
        for (BudgetResult.BandLevel b : r.bands()) {
            sb.append(Numbers.f("%8s %11.2f %11.2f %9.2f%n", Numbers.plain(b.nominalHz()), b.lowHz(), b.highHz(), b.dbv()));
        }
        sb.append(Numbers.f("%n%12s %14s%n", "Hz", "V/√Hz"));
        for (BudgetResult.DensityPoint p : r.outputDensity()) {
            sb.append(Numbers.f("%12.4f %14s%n", p.hz(), volts(p.vPerRtHz())));
        }
        sb.append('\n').append(LEGEND).append('\n');
        return sb.toString();
    }

    /** Four significant digits, scientific notation: the figures span many decades. */
    private static String volts(double v) {
        return Numbers.f("%.4g", v);
    }

    private static String bandsCsv(BudgetResult r) {
        StringBuilder sb = new StringBuilder("nominalHz,lowHz,highHz,dbv\n");
        for (BudgetResult.BandLevel b : r.bands()) {
            sb.append(Numbers.plain(b.nominalHz())).append(',').append(Numbers.plain(b.lowHz())).append(',')
                    .append(Numbers.plain(b.highHz())).append(',').append(Numbers.plain(b.dbv())).append('\n');
        }
        return sb.toString();
    }

    private static String densityCsv(BudgetResult r) {
        StringBuilder sb = new StringBuilder("hz,vPerRtHz\n");
        for (BudgetResult.DensityPoint p : r.outputDensity()) {
            sb.append(Numbers.plain(p.hz())).append(',').append(Numbers.plain(p.vPerRtHz())).append('\n');
        }
        return sb.toString();
    }

    static String json(Design d, BudgetResult r) {
        return json(d, r, null, null);
    }

    static String json(Design d, BudgetResult r, SourceFit.Result fit, Path capture) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = m.createObjectNode();
        root.put("name", d.name());
        ArrayNode range = root.putArray("rangeHz");
        range.add(r.loHz());
        range.add(r.hiHz());
        root.put("temperatureC", r.temperatureC());
        if (fit != null) {
            ObjectNode f = root.putObject("sourceFit");
            f.put("capture", capture.getFileName().toString());
            f.put("densityVPerRtHz", fit.densityVPerRtHz());
            f.put("densitySigma", fit.densitySigma());
            f.put("flickerCornerHz", fit.flickerCornerHz());
            f.put("flickerCornerSigmaHz", fit.cornerSigmaHz());
            f.put("bands", fit.bands());
            f.put("chiSquarePerDof", fit.chiSquarePerDof());
        }
        root.put("quadratureNodes", r.quadratureNodes());
        root.put("outputRmsV", r.outputRmsV());
        if (r.hasSource()) {
            root.put("sourceRmsV", r.sourceRmsV());
        } else {
            root.putNull("sourceRmsV");
        }
        root.put("selfNoiseRmsV", r.selfNoiseRmsV());
        putOptional(root, "sourceToSelfDb", r.sourceToSelfDb());
        root.put("rateRmsVPerS", r.rateRmsVPerS());
        root.put("zeroCrossingsPerS", r.zeroCrossingsPerS());
        ArrayNode dens = root.putArray("outputDensity");
        for (BudgetResult.DensityPoint p : r.outputDensity()) {
            ObjectNode o = dens.addObject();
            o.put("hz", p.hz());
            o.put("vPerRtHz", p.vPerRtHz());
        }
        ArrayNode bands = root.putArray("bands");
        for (BudgetResult.BandLevel b : r.bands()) {
            ObjectNode o = bands.addObject();
            o.put("nominalHz", b.nominalHz());
            o.put("lowHz", b.lowHz());
            o.put("highHz", b.highHz());
            o.put("dbv", b.dbv());
        }
        ArrayNode stages = root.putArray("stages");
        for (BudgetResult.StageReading s : r.stages()) {
            ObjectNode o = stages.addObject();
            o.put("stage", s.stage());
            o.put("node", s.node());
            if (s.opamp().isPresent()) {
                o.put("opamp", s.opamp().get());
            } else {
                o.putNull("opamp");
            }
            o.put("rmsV", s.rmsV());
            putOptional(o, "swingV", s.swingV());
            putOptional(o, "headroomDb", s.headroomDb());
            putOptional(o, "clipProbability", s.clipProbability());
            o.put("slewRmsVPerUs", s.slewRmsVPerUs());
            o.put("slew4SigmaVPerUs", s.slew4SigmaVPerUs());
            putOptional(o, "slewVPerUs", s.slewVPerUs());
        }
        ArrayNode cs = root.putArray("contributors");
        for (BudgetResult.Contributor c : r.contributors()) {
            ObjectNode o = cs.addObject();
            o.put("name", c.name());
            o.put("rmsV", c.rmsV());
        }
        root.put("legend", LEGEND);
        try {
            return m.writeValueAsString(root) + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    private static void putOptional(ObjectNode o, String key, Optional<Double> v) {
        if (v.isPresent()) {
            o.put(key, v.get());
        } else {
            o.putNull(key);
        }
    }

    private static FrequencyChart chart(Design d, NoiseBudget budget, BudgetResult r) {
        double[] hz = LogGrid.points(r.loHz(), r.hiHz(), 50);
        double[] total = new double[hz.length];
        double[] src = new double[hz.length];
        double[] own = new double[hz.length];
        for (int i = 0; i < hz.length; i++) {
            double[] parts = budget.outputDensityParts(hz[i]);
            total[i] = 10 * Math.log10(parts[0] + parts[1]);
            src[i] = 10 * Math.log10(parts[0]);
            own[i] = 10 * Math.log10(parts[1]);
        }
        List<FrequencyChart.Curve> curves = new java.util.ArrayList<>();
        curves.add(new FrequencyChart.Curve("output", hz, total, false));
        if (r.hasSource() && r.selfNoiseRmsV() > 0) {
            curves.add(new FrequencyChart.Curve("source's part", hz, src, true));
            curves.add(new FrequencyChart.Curve("circuit's own", hz, own, true));
        }
        int n = r.bands().size();
        double[] lo = new double[n];
        double[] hi = new double[n];
        double[] db = new double[n];
        for (int i = 0; i < n; i++) {
            lo[i] = r.bands().get(i).lowHz();
            hi[i] = r.bands().get(i).highHz();
            db[i] = r.bands().get(i).dbv();
        }
        return new FrequencyChart("Noise budget: " + d.name(), List.of(
                new FrequencyChart.Panel("density, dB re 1 V/√Hz", curves, List.of(), List.of()),
                new FrequencyChart.Panel("band level, dBV", List.of(), List.of(FrequencyChart.BandBars.of("bands", lo, hi, db)),
                        List.of())));
    }
}
