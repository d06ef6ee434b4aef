package org.roseate.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.roseate.bands.BandFraction;
import org.roseate.compare.BandReading;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.LogGrid;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;
import org.roseate.plot.ChartFiles;
import org.roseate.plot.Charts;
import org.roseate.plot.FrequencyChart;
import org.roseate.tools.CaptureColumn;
import org.roseate.tools.ComparedColumn;
import org.roseate.tools.DesignColumn;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code compare A.json B.json …}: band levels and deviations side by side. */
@Command(name = "compare", mixinStandardHelpOptions = true,
        description = "Compare designs side by side: band levels normalised at 1 kHz, deviations from the target, "
                + "slope, peak deviation (pointwise and band) and ripple.")
final class CompareCommand implements Callable<Integer> {
    enum Format { table, json, csv }

    @picocli.CommandLine.Mixin
    BandOptions bandOptions = new BandOptions();

    @Parameters(arity = "1..*", paramLabel = "DESIGN.json|CAPTURE.wav",
            description = "design files and captures (WAV, first channel or --channel), in any order")
    List<Path> files;

    @picocli.CommandLine.Option(names = "--channel", defaultValue = "1", description = "channel of the captures, 1-based (default: ${DEFAULT-VALUE})")
    int channel;

    @Option(names = "--format", defaultValue = "table", description = "table, json or csv (default: ${DEFAULT-VALUE})")
    Format format;

    @Option(names = "--plot", paramLabel = "FILE.png|FILE.svg", description = "also draw the comparison")
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
        checkPlotName(plot);
        List<ComparedColumn> columns = new ArrayList<>();
        for (Path f : files) {
            if (f.getFileName().toString().toLowerCase(java.util.Locale.ROOT).endsWith(".wav")) {
                try {
                    CaptureColumn c = CaptureColumn.of(f, channel - 1, r, target, fraction);
                    for (String w : c.result().warnings()) {
                        spec.commandLine().getErr().println("roseate: " + w);
                    }
                    columns.add(c);
                } catch (org.roseate.measure.MeasureException | IllegalArgumentException e) {
                    throw new UserInputException(e.getMessage());
                }
                continue;
            }
            CircuitModel m = Inputs.model(f);
            DesignAnalysis a;
            try {
                a = DesignAnalysis.of(m, r, target, fraction, LogGrid.points(r.loHz(), r.hiHz(), 20));
            } catch (IllegalArgumentException e) {
                throw new UserInputException(e.getMessage());
            }
            columns.add(new DesignColumn(f.getFileName().toString(), a));
        }
        PrintWriter out = spec.commandLine().getOut();
        switch (format) {
            case json -> out.print(json(columns));
            case csv -> out.print(csv(columns));
            default -> out.print(table(columns, target, fraction));
        }
        out.flush();
        if (plot != null) {
            writePlot(Charts.comparison(columns), plot, force);
        }
        return 0;
    }

    static String table(List<ComparedColumn> cols, TargetSlope target, BandFraction fraction) {
        StringBuilder sb = new StringBuilder();
        sb.append(Numbers.f("Target %s, %s bands. Level: band level minus the 1 kHz band's; dev: centred deviation from the target "
                + "(captures: inverse-variance weighted centring; ±: one standard deviation of a capture's band level).%n%n",
                target.describe(), fraction.displayName()));
        for (int i = 0; i < cols.size(); i++) {
            sb.append(Numbers.f("  [%d] %s%n", i + 1, cols.get(i).name()));
        }
        sb.append(Numbers.f("%n%8s", "band"));
        for (int i = 0; i < cols.size(); i++) {
            sb.append(Numbers.f(" %10s %8s", "[" + (i + 1) + "] level", "dev"));
            if (cols.get(i) instanceof CaptureColumn) {
                sb.append(Numbers.f(" %7s", "±dB"));
            }
        }
        sb.append('\n');
        int n = cols.get(0).bands().readings().size();
        List<double[]> norm = cols.stream().map(ComparedColumn::normalisedLevelsDb).toList();
        for (int b = 0; b < n; b++) {
            sb.append(Numbers.f("%8s", cols.get(0).bands().readings().get(b).band().label()));
            for (int i = 0; i < cols.size(); i++) {
                sb.append(Numbers.f(" %+10.3f %+8.3f", norm.get(i)[b], cols.get(i).bands().readings().get(b).deviationDb()));
                if (cols.get(i) instanceof CaptureColumn c) {
                    double u = c.uncertaintiesDb()[b];
                    sb.append(Double.isNaN(u) ? Numbers.f(" %7s", "—") : Numbers.f(" %7.3f", u));
                }
            }
            sb.append('\n');
        }
        sb.append('\n');
        row(sb, "slope", "least-squares slope, dB/octave", cols, ComparedColumn::slopeDbPerOctave, "%+20.3f");
        row(sb, "± slope", "captures: one standard deviation of the slope, dB/octave", cols,
                c -> c instanceof CaptureColumn k ? k.result().slopeDbPerOctave().uncertainty() : Double.NaN, "%20.3f");
        row(sb, "peak", "pointwise peak deviation, ±dB", cols, ComparedColumn::maxDeviationDb, "%20.3f");
        row(sb, "band pk", "band peak deviation, ±dB", cols, ComparedColumn::maxBandDeviationDb, "%20.3f");
        row(sb, "± pk", "captures: one standard deviation of the band peak, dB", cols,
                c -> c instanceof CaptureColumn k ? k.result().maxBandDeviationDb().uncertainty() : Double.NaN, "%20.3f");
        row(sb, "ripple", "largest minus smallest band deviation, dB", cols, ComparedColumn::rippleDb, "%20.3f");
        return sb.toString();
    }

    private static void row(StringBuilder sb, String label, String meaning, List<ComparedColumn> cols,
            java.util.function.ToDoubleFunction<ComparedColumn> f, String fmt) {
        sb.append(Numbers.f("%8s", label));
        for (ComparedColumn c : cols) {
            double v = f.applyAsDouble(c);
            sb.append(Double.isNaN(v) ? Numbers.f("%20s", "—") : Numbers.f(fmt, v));
        }
        sb.append("   ").append(meaning).append('\n');
    }

    static String csv(List<ComparedColumn> cols) {
        StringBuilder sb = new StringBuilder("column,nominalHz,lowHz,highHz,db,levelRe1kHzDb,deviationDb,uncertaintyDb\n");
        for (ComparedColumn c : cols) {
            double[] norm = c.normalisedLevelsDb();
            double[] u = c instanceof CaptureColumn k ? k.uncertaintiesDb() : null;
            List<BandReading> rs = c.bands().readings();
            for (int i = 0; i < rs.size(); i++) {
                BandReading b = rs.get(i);
                sb.append(quote(c.name())).append(',').append(Numbers.plain(b.band().nominalHz())).append(',')
                        .append(Numbers.plain(b.band().lowHz())).append(',').append(Numbers.plain(b.band().highHz())).append(',')
                        .append(Numbers.plain(b.levelDb())).append(',').append(Numbers.plain(norm[i])).append(',')
                        .append(Numbers.plain(b.deviationDb())).append(',')
                        .append(u == null ? "" : Numbers.plain(u[i])).append('\n');
            }
        }
        return sb.toString();
    }

    private static String quote(String s) {
        return s.contains(",") || s.contains("\"") ? "\"" + s.replace("\"", "\"\"") + "\"" : s;
    }

    static String json(List<ComparedColumn> cols) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = m.createObjectNode();
        ArrayNode arr = root.putArray("columns");
        for (ComparedColumn c : cols) {
            ObjectNode o = arr.addObject();
            o.put("name", c.name());
            o.put("slopeDbPerOctave", c.slopeDbPerOctave());
            if (Double.isNaN(c.maxDeviationDb())) {
                o.putNull("maxDeviationDb");
            } else {
                o.put("maxDeviationDb", c.maxDeviationDb());
            }
            o.put("maxBandDeviationDb", c.maxBandDeviationDb());
            o.put("rippleDb", c.rippleDb());
            double[] u = null;
            if (c instanceof CaptureColumn k) {
                o.put("kind", "capture");
                putOrNull(o, "slopeUncertaintyDbPerOctave", k.result().slopeDbPerOctave().uncertainty());
                putOrNull(o, "maxBandDeviationUncertaintyDb", k.result().maxBandDeviationDb().uncertainty());
                o.put("clippedSamples", k.result().clippedSamples());
                u = k.uncertaintiesDb();
            } else {
                o.put("kind", "design");
            }
            ArrayNode bs = o.putArray("bands");
            double[] norm = c.normalisedLevelsDb();
            List<BandReading> rs = c.bands().readings();
            for (int i = 0; i < rs.size(); i++) {
                ObjectNode b = bs.addObject();
                b.put("nominalHz", rs.get(i).band().nominalHz());
                b.put("db", rs.get(i).levelDb());
                b.put("levelRe1kHzDb", norm[i]);
                b.put("deviationDb", rs.get(i).deviationDb());
                if (u != null) {
                    putOrNull(b, "uncertaintyDb", u[i]);
                }
            }
        }
        try {
            return m.writeValueAsString(root) + "\n";
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    private static void putOrNull(ObjectNode o, String key, double v) {
        if (Double.isFinite(v)) {
            o.put(key, v);
        } else {
            o.putNull(key);
        }
    }

    /** Refuses a plot name that is neither .png nor .svg before any work is done. */
    static void checkPlotName(Path plot) {
        if (plot != null) {
            try {
                ChartFiles.formatOf(plot);
            } catch (IllegalArgumentException e) {
                throw new UserInputException("--plot: " + e.getMessage());
            }
        }
    }

    /** Writes a chart for the --plot option of analyze, compare and tolerance. */
    static void writePlot(FrequencyChart chart, Path file, boolean force) {
        try {
            ChartFiles.write(chart, file, ChartFiles.DEFAULT_WIDTH, ChartFiles.DEFAULT_HEIGHT, force);
        } catch (org.roseate.io.OutputExistsException e) {
            throw new UserInputException(e.getMessage());
        } catch (IOException e) {
            throw new UserInputException(file + ": " + (e.getMessage() == null ? e.toString() : e.getMessage()));
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--plot: " + e.getMessage());
        }
    }
}
