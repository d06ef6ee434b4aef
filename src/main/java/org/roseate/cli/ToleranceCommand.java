package org.roseate.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;
import org.roseate.plot.Charts;
import org.roseate.tools.Distribution;
import org.roseate.tools.MonteCarlo;
import org.roseate.tools.Quantiles;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code tolerance DESIGN.json}: Monte Carlo spread of the band levels, yield and sensitivities. */
@Command(name = "tolerance", mixinStandardHelpOptions = true,
        description = "Monte Carlo tolerance analysis: per-band percentiles of level and deviation, the spread of the "
                + "peak band deviation, the yield against a limit and each part's sensitivity.")
final class ToleranceCommand implements Callable<Integer> {
    enum Format { table, json }

    @picocli.CommandLine.Mixin
    BandOptions bandOptions = new BandOptions();

    @Parameters(index = "0", paramLabel = "DESIGN.json", description = "design file (tolerances from its \"tolerance\" map)")
    Path file;

    @Option(names = "--trials", defaultValue = "2000", description = "number of trials (default: ${DEFAULT-VALUE})")
    int trials;

    @Option(names = "--distribution", defaultValue = "uniform", description = "uniform or gaussian (tolerance = 3σ, truncated) (default: ${DEFAULT-VALUE})")
    String distribution;

    @Option(names = "--seed", defaultValue = "1", description = "random seed (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--limit", defaultValue = "1dB", description = "yield limit on the peak band deviation (default: ${DEFAULT-VALUE})")
    String limit;

    @Option(names = "--threads", description = "worker threads (default: all cores; results do not depend on it)")
    Integer threads;

    @Option(names = "--format", defaultValue = "table", description = "table or json (default: ${DEFAULT-VALUE})")
    Format format;

    @Option(names = "--plot", paramLabel = "FILE.png|FILE.svg", description = "also draw the 5–95 % envelope")
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
        Distribution dist = Distribution.parse(distribution)
                .orElseThrow(() -> new UserInputException("--distribution: expected uniform or gaussian, found '" + distribution + "'"));
        if (trials < 1 || trials > 10_000_000) {
            throw new UserInputException("--trials: expected 1 to 10000000, found " + trials);
        }
        double limitDb = limitDb(limit);
        int cores = threads == null ? Runtime.getRuntime().availableProcessors() : threads;
        if (cores < 1 || cores > 256) {
            throw new UserInputException("--threads: expected 1 to 256, found " + cores);
        }
        CompareCommand.checkPlotName(plot);
        Design d = DesignReader.read(file);
        CircuitModel.of(d, file.getFileName().toString());
        MonteCarlo.Spec ms;
        try {
            ms = new MonteCarlo.Spec(d, r, target, fraction, trials, dist, seed, limitDb, cores);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(e.getMessage());
        }
        FitCommand.ProgressBar bar = FitCommand.ProgressBar.forTerminal(spec.commandLine().getErr(), "trials");
        MonteCarlo.Result res;
        try {
            res = MonteCarlo.run(ms, bar);
        } finally {
            bar.finish();
        }
        PrintWriter out = spec.commandLine().getOut();
        out.print(format == Format.json ? json(res) : table(res));
        out.flush();
        if (plot != null) {
            CompareCommand.writePlot(Charts.tolerance(res), plot, force);
        }
        return 0;
    }

    static double limitDb(String text) {
        String t = text.trim().toLowerCase(java.util.Locale.ROOT);
        if (t.endsWith("db")) {
            t = t.substring(0, t.length() - 2).trim();
        }
        try {
            double v = Double.parseDouble(t);
            if (v > 0 && Double.isFinite(v)) {
                return v;
            }
        } catch (NumberFormatException e) {
            // fall through to the message
        }
        throw new UserInputException("--limit: expected a peak deviation in dB such as 1dB or 0.5, found '" + text + "'");
    }

    static String table(MonteCarlo.Result r) {
        StringBuilder sb = new StringBuilder();
        MonteCarlo.Spec s = r.spec();
        sb.append("Tolerance: ").append(s.design().name()).append('\n');
        sb.append(Numbers.f("%d trials, %s, seed %d; target %s, %s bands%n", s.trials(),
                s.distribution() == Distribution.UNIFORM ? "uniform within ± tolerance"
                        : "Gaussian, tolerance = 3σ, truncated at ±3σ", s.seed(), s.target().describe(), s.fraction().displayName()));
        sb.append("Drawn at random: ").append(r.toleranced().isEmpty() ? "none" : String.join(" ", r.toleranced())).append('\n');
        sb.append("Held exact (no tolerance in the design): ").append(r.exact().isEmpty() ? "none" : String.join(" ", r.exact())).append("\n\n");
        Quantiles p = r.peakDb();
        sb.append(Numbers.f("Peak band deviation: nominal ±%.3f dB; 5%% %.3f, median %.3f, 95%% %.3f dB (±%.3f, ±%.3f, ±%.3f)%n",
                r.nominalPeakDb(), p.p5(), p.p50(), p.p95(), p.se5(), p.se50(), p.se95()));
        sb.append(Numbers.f("Yield (peak band deviation ≤ %.3g dB): %.1f %% ± %.1f %% (binomial standard error)%n%n",
                s.limitDb(), 100 * r.yield(), 100 * r.yieldStandardError()));
        sb.append(Numbers.f("%8s %9s %9s %9s %9s %8s %8s %8s%n", "band", "nominal", "level 5%", "50%", "95%", "dev 5%", "50%", "95%"));
        for (MonteCarlo.BandSpread b : r.bands()) {
            sb.append(Numbers.f("%8s %9.3f %9.3f %9.3f %9.3f %+8.3f %+8.3f %+8.3f%n", b.band().label(), b.nominalLevelDb(),
                    b.levelDb().p5(), b.levelDb().p50(), b.levelDb().p95(), b.deviationDb().p5(), b.deviationDb().p50(),
                    b.deviationDb().p95()));
        }
        sb.append("\nHistogram of the peak band deviation:\n");
        MonteCarlo.Histogram h = r.histogram();
        int most = 1;
        for (int c : h.counts()) {
            most = Math.max(most, c);
        }
        for (int i = 0; i < h.counts().length; i++) {
            sb.append(Numbers.f("  %6.3f–%6.3f dB %6d %s%n", h.edgesDb()[i], h.edgesDb()[i + 1], h.counts()[i],
                    "#".repeat((int) Math.round(40.0 * h.counts()[i] / most))));
        }
        sb.append("\nSensitivity, dB per +1 % of value (band level; 'shape' = the part not common to all bands):\n");
        sb.append(Numbers.f("  %-6s %9s %12s %12s%n", "part", "tolerance", "max level", "max shape"));
        for (MonteCarlo.PartSensitivity ps : r.sensitivities()) {
            sb.append(Numbers.f("  %-6s %9s %12.4f %12.4f%n", ps.designator(), ps.tolerance() == null ? "exact" : ps.tolerance().toString(),
                    ps.maxLevelDb(), ps.maxShapeDb()));
        }
        sb.append("Parts at the top of this list deserve the tightest tolerance.\n");
        return sb.toString();
    }

    static String json(MonteCarlo.Result r) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = m.createObjectNode();
        root.put("name", r.spec().design().name());
        root.put("trials", r.spec().trials());
        root.put("distribution", r.spec().distribution().name().toLowerCase(java.util.Locale.ROOT));
        root.put("seed", r.spec().seed());
        root.put("nominalMaxBandDeviationDb", r.nominalPeakDb());
        quantiles(root.putObject("maxBandDeviationDb"), r.peakDb());
        root.put("limitDb", r.spec().limitDb());
        root.put("yield", r.yield());
        root.put("yieldStandardError", r.yieldStandardError());
        ArrayNode ex = root.putArray("exact");
        r.exact().forEach(ex::add);
        ArrayNode bands = root.putArray("bands");
        for (MonteCarlo.BandSpread b : r.bands()) {
            ObjectNode o = bands.addObject();
            o.put("nominalHz", b.band().nominalHz());
            o.put("nominalDb", b.nominalLevelDb());
            quantiles(o.putObject("db"), b.levelDb());
            quantiles(o.putObject("deviationDb"), b.deviationDb());
        }
        ArrayNode sens = root.putArray("sensitivities");
        for (MonteCarlo.PartSensitivity ps : r.sensitivities()) {
            ObjectNode o = sens.addObject();
            o.put("designator", ps.designator());
            o.put("tolerance", ps.tolerance() == null ? null : ps.tolerance().toString());
            o.put("maxLevelDbPerPercent", ps.maxLevelDb());
            o.put("maxShapeDbPerPercent", ps.maxShapeDb());
            ArrayNode per = o.putArray("bandDbPerPercent");
            for (double v : ps.levelDbPerPercent()) {
                per.add(v);
            }
        }
        try {
            return m.writeValueAsString(root) + "\n";
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    private static void quantiles(ObjectNode o, Quantiles q) {
        o.put("p5", q.p5());
        o.put("p50", q.p50());
        o.put("p95", q.p95());
        o.put("se5", q.se5());
        o.put("se50", q.se50());
        o.put("se95", q.se95());
    }
}
