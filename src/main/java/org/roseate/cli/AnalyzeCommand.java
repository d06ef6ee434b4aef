package org.roseate.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.roseate.bands.BandFraction;
import org.roseate.compare.BandReading;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.LogGrid;
import org.roseate.compare.SlopeFit;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;
import org.roseate.model.FrequencyResponse;
import org.roseate.model.Root;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code analyze DESIGN.json}: the exact response against the target slope. */
@Command(name = "analyze", mixinStandardHelpOptions = true,
        description = "Exact response of a design: band levels and deviation from the target slope, "
                + "least-squares slope, peak deviation, poles and zeros.")
final class AnalyzeCommand implements Callable<Integer> {
    static final String LEGEND = "Band level: 10·log10 ∫|H(f)|² df, the power of unit-density white noise through "
            + "the design in the band. Deviation: band level minus the target's band level, centred so the largest "
            + "and smallest are equal and opposite. An ideal pink filter reads flat (0.00 dB) in every band.";

    enum Format { table, json, csv }

    @picocli.CommandLine.Mixin
    BandOptions bandOptions = new BandOptions();

    @Parameters(index = "0", paramLabel = "DESIGN.json", description = "design file")
    Path file;

    @Option(names = "--format", defaultValue = "table", description = "table, json or csv (default: ${DEFAULT-VALUE})")
    Format format;

    @Option(names = "--freqs", paramLabel = "F1,F2,…", description = "response points in Hz (default: a log grid over the range)")
    String freqs;

    @Option(names = "--rate", paramLabel = "HZ",
            description = "also show the digital model's fidelity at this output rate (per third-octave band, against the analog model)")
    Integer rate;

    @Option(names = "--points-per-decade", defaultValue = "20", description = "density of the default response grid (default: ${DEFAULT-VALUE})")
    int pointsPerDecade;

    @Option(names = "--with-source", description = "judge source × circuit: the design file's \"source\" density shape "
            + "d²·(1 + fc/f) times |H|² (levels relative to d²)")
    boolean withSource;

    @Option(names = "--plot", paramLabel = "FILE.png|FILE.svg", description = "also draw the response, deviation and band bars")
    Path plot;

    @Option(names = "--force", description = "replace an existing plot file")
    boolean force;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        FrequencyRange r = bandOptions.range();
        TargetSlope target = bandOptions.target();
        BandFraction fraction = bandOptions.fraction();
        if (pointsPerDecade < 1 || pointsPerDecade > 10000) {
            throw new UserInputException("--points-per-decade: expected 1 to 10000, found " + pointsPerDecade);
        }
        double[] points = freqs == null ? LogGrid.points(r.loHz(), r.hiHz(), pointsPerDecade) : Inputs.frequencies(freqs, "--freqs");
        CompareCommand.checkPlotName(plot);
        CircuitModel model = Inputs.model(file);
        DesignAnalysis a;
        try {
            a = withSource ? DesignAnalysis.withSource(model, r, target, fraction, points, sourceShape(model))
                    : DesignAnalysis.of(model, r, target, fraction, points);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(e.getMessage());
        }
        org.roseate.digital.FidelityReport fidelity = rate == null ? null : fidelity(model);
        PrintWriter out = spec.commandLine().getOut();
        switch (format) {
            case json -> out.print(json(a, model, fidelity));
            case csv -> out.print(freqs == null ? bandsCsv(a) : responseCsv(a.response()));
            default -> {
                out.print(table(a, model));
                if (fidelity != null) {
                    out.print("\n" + Fidelity.table(fidelity, org.roseate.noise.NoiseChain.FIDELITY_TOLERANCE_DB));
                }
            }
        }
        out.flush();
        if (plot != null) {
            CompareCommand.writePlot(org.roseate.plot.Charts.analysis(a, model), plot, force);
        }
        return 0;
    }

    /** The source's relative shape 1 + fc/f; refused when the design file has no source. */
    private java.util.function.DoubleUnaryOperator sourceShape(CircuitModel model) {
        org.roseate.circuit.SourceNoise src = model.design().source().orElseThrow(() -> new UserInputException(
                file.getFileName() + ": --with-source needs a \"source\" in the design file, such as "
                        + "\"source\": {\"densityVPerRtHz\": 150e-6, \"flickerCornerHz\": 250}"));
        return src::shape;
    }

    private String table(DesignAnalysis a, CircuitModel model) {
        StringBuilder sb = new StringBuilder();
        SlopeFit s = a.slope();
        sb.append("Design: ").append(a.name()).append(" (").append(file.getFileName()).append(")\n");
        if (!model.design().description().isBlank()) {
            sb.append("  ").append(model.design().description()).append('\n');
        }
        if (withSource) {
            model.design().source().ifPresent(src -> sb.append(Numbers.f("Judged with the source: levels of source × circuit "
                    + "relative to the source's white density (1/f corner %s Hz)%n", Numbers.plain(src.flickerCornerHz()))));
        }
        sb.append(Numbers.f("Target: %s over %s – %s, %s bands%n", a.target().describe(),
                Numbers.hz(a.range().loHz()), Numbers.hz(a.range().hiHz()), a.fraction().displayName()));
        sb.append(Numbers.f("Least-squares slope:   %+.3f dB/octave (target %+.3f)%n", s.slopeDbPerOctave(), a.target().dbPerOctave()));
        sb.append(Numbers.f("Peak deviation:        ±%.3f dB (pointwise, %d points/decade)%n", s.maxDeviationDb(), SlopeFit.POINTS_PER_DECADE));
        sb.append(Numbers.f("Peak band deviation:   ±%.3f dB (%s bands)%n%n", a.bands().maxBandDeviationDb(), a.fraction().displayName()));
        sb.append(Numbers.f("%8s %11s %11s %11s %10s%n", "band", "low Hz", "high Hz", "level dB", "dev dB"));
        for (BandReading b : a.bands().readings()) {
            sb.append(Numbers.f("%8s %11.2f %11.2f %11.3f %+10.3f%n", b.band().label(), b.band().lowHz(),
                    b.band().highHz(), b.levelDb(), b.deviationDb()));
        }
        sb.append('\n').append(wrap(LEGEND, 96)).append('\n');
        if (freqs != null) {
            sb.append(Numbers.f("%n%12s %11s %10s%n", "Hz", "dB", "deg"));
            FrequencyResponse r = a.response();
            for (int i = 0; i < r.size(); i++) {
                sb.append(Numbers.f("%12.4f %11.4f %10.3f%n", r.hz()[i], r.db(i), r.deg(i)));
            }
        }
        sb.append("\nPoles:").append(roots(a.poles())).append('\n');
        sb.append("Zeros:").append(roots(a.zeros())).append('\n');
        return sb.toString();
    }

    private static String roots(List<Root> roots) {
        if (roots.isEmpty()) {
            return " none";
        }
        StringBuilder sb = new StringBuilder();
        for (Root r : roots) {
            sb.append("\n  ").append(Numbers.f("%12.4f Hz", r.hz()));
            sb.append(r.isReal() ? (r.s().re() > 0 ? "  real, right half-plane" : r.hz() == 0 ? "  at the origin" : "  real")
                    : Numbers.f("  Q = %.4f", r.q()));
        }
        return sb.toString();
    }

    private static String wrap(String text, int width) {
        StringBuilder sb = new StringBuilder();
        int col = 0;
        for (String w : text.split(" ")) {
            if (col + w.length() + 1 > width && col > 0) {
                sb.append('\n');
                col = 0;
            } else if (col > 0) {
                sb.append(' ');
                col++;
            }
            sb.append(w);
            col += w.length();
        }
        return sb.toString();
    }

    private String bandsCsv(DesignAnalysis a) {
        StringBuilder sb = new StringBuilder("nominalHz,lowHz,highHz,db,deviationDb\n");
        for (BandReading b : a.bands().readings()) {
            sb.append(Numbers.plain(b.band().nominalHz())).append(',').append(Numbers.plain(b.band().lowHz())).append(',')
                    .append(Numbers.plain(b.band().highHz())).append(',').append(Numbers.plain(b.levelDb())).append(',')
                    .append(Numbers.plain(b.deviationDb())).append('\n');
        }
        return sb.toString();
    }

    private static String responseCsv(FrequencyResponse r) {
        StringBuilder sb = new StringBuilder("hz,db,deg\n");
        for (int i = 0; i < r.size(); i++) {
            sb.append(Numbers.plain(r.hz()[i])).append(',').append(Numbers.plain(r.db(i))).append(',')
                    .append(Numbers.plain(r.deg(i))).append('\n');
        }
        return sb.toString();
    }

    static ObjectNode analysisJson(ObjectMapper m, DesignAnalysis a, CircuitModel model) {
        ObjectNode root = m.createObjectNode();
        root.put("name", a.name());
        root.put("description", model.design().description());
        ObjectNode t = root.putObject("target");
        t.put("slopeDbPerOctave", a.target().dbPerOctave());
        t.put("description", a.target().describe());
        ObjectNode rg = root.putObject("range");
        rg.put("loHz", a.range().loHz());
        rg.put("hiHz", a.range().hiHz());
        root.put("bandFraction", a.fraction() == BandFraction.OCTAVE ? "octave" : "third");
        root.put("slopeDbPerOctave", a.slope().slopeDbPerOctave());
        root.put("maxDeviationDb", a.slope().maxDeviationDb());
        root.put("maxBandDeviationDb", a.bands().maxBandDeviationDb());
        ArrayNode resp = root.putArray("response");
        FrequencyResponse r = a.response();
        for (int i = 0; i < r.size(); i++) {
            ObjectNode p = resp.addObject();
            p.put("hz", r.hz()[i]);
            p.put("db", r.db(i));
            p.put("deg", r.deg(i));
        }
        ArrayNode bands = root.putArray("bands");
        for (BandReading b : a.bands().readings()) {
            ObjectNode o = bands.addObject();
            o.put("nominalHz", b.band().nominalHz());
            o.put("lowHz", b.band().lowHz());
            o.put("highHz", b.band().highHz());
            o.put("db", b.levelDb());
            o.put("deviationDb", b.deviationDb());
        }
        putRoots(root.putArray("poles"), a.poles());
        putRoots(root.putArray("zeros"), a.zeros());
        root.put("legend", LEGEND);
        return root;
    }

    private static void putRoots(ArrayNode arr, List<Root> roots) {
        for (Root r : roots) {
            ObjectNode o = arr.addObject();
            o.put("hz", r.hz());
            if (r.isReal()) {
                o.putNull("q");
            } else {
                o.put("q", r.q());
            }
            o.put("re", r.s().re() / (2 * Math.PI));
            o.put("im", r.s().im() / (2 * Math.PI));
        }
    }

    private org.roseate.digital.FidelityReport fidelity(CircuitModel model) {
        if (rate < 100 || rate > 384000) {
            throw new UserInputException("--rate: expected an output rate from 100 to 384000 Hz, found " + rate);
        }
        try {
            return org.roseate.noise.NoiseChain.fidelity(model.zpk(), rate);
        } catch (org.roseate.digital.UnrenderableModelException e) {
            throw new UserInputException(file.getFileName() + ": cannot render: " + e.getMessage());
        }
    }

    private String json(DesignAnalysis a, CircuitModel model, org.roseate.digital.FidelityReport fidelity) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        try {
            ObjectNode root = analysisJson(m, a, model);
            root.put("withSource", withSource);
            if (fidelity != null) {
                ObjectNode f = root.putObject("fidelity");
                f.put("rateHz", fidelity.outputRateHz());
                f.put("oversampling", fidelity.factor());
                f.put("maxAbsDifferenceDb", fidelity.maxAbsDifferenceDb());
                ArrayNode bands = f.putArray("bands");
                for (org.roseate.digital.FidelityReport.Band b : fidelity.bands()) {
                    ObjectNode o = bands.addObject();
                    o.put("lowHz", b.lowHz());
                    o.put("highHz", b.comparedHighHz());
                    o.put("differenceDb", b.differenceDb());
                }
            }
            return m.writeValueAsString(root) + "\n";
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }
}
