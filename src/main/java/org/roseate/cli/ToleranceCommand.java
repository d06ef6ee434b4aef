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
import org.roseate.tools.BinnedQuantiles;
import org.roseate.tools.Quantiles;
import org.roseate.tools.ToleranceOverrides;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code tolerance DESIGN.json}: Monte Carlo spread of the band levels, yield and sensitivities. */
@Command(name = "tolerance", mixinStandardHelpOptions = true,
        description = {"Monte Carlo tolerance analysis: per-band percentiles of level and deviation, the spread of the "
                + "peak band deviation, the yield against a limit and each part's sensitivity, ranked by its contribution "
                + "(sensitivity × tolerance).",
            "Memory stays flat for any trial count: percentiles come from 0.001 dB bins and are within "
                + "±0.0005 dB of the exact percentiles of the same trials."})
final class ToleranceCommand implements Callable<Integer> {
    enum Format { table, json }

    @picocli.CommandLine.Mixin
    BandOptions bandOptions = new BandOptions();

    @Parameters(index = "0", paramLabel = "DESIGN.json", description = "design file (tolerances from its \"tolerance\" map)")
    Path file;

    @Option(names = "--trials", defaultValue = "2000", description = "number of trials (default: ${DEFAULT-VALUE})")
    int trials;

    @Option(names = "--distribution", defaultValue = "uniform",
            description = "uniform within ± tolerance, or gaussian: σ = tolerance/3, draws beyond ±3σ rejected and drawn again "
                    + "(so no part lies outside its tolerance) (default: ${DEFAULT-VALUE})")
    String distribution;

    @Option(names = "--tolerance", paramLabel = "R=1%,C=5%,C3=2%,U=20%",
            description = "tolerances per kind letter or designator, over the file's own; U spreads every op-amp's gbwHz")
    String tolerance;

    @Option(names = "--against-nominal", description = "judge each trial against the nominal design's own band levels (any shape) instead of the target slope")
    boolean againstNominal;

    @Option(names = "--seed", defaultValue = "1", description = "random seed (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--limit", defaultValue = "1dB", description = "yield limit on the peak band deviation (default: ${DEFAULT-VALUE})")
    String limit;

    @Option(names = "--threads", description = "worker threads (default: all cores; results do not depend on it)")
    Integer threads;

    @Option(names = "--format", defaultValue = "table", description = "table or json (default: ${DEFAULT-VALUE})")
    Format format;

    @Option(names = "--plot", paramLabel = "FILE.png|FILE.svg", description = "also draw the 5–95 %% envelope")
    Path plot;

    @Option(names = "--force", description = "replace an existing plot file")
    boolean force;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        var parse = spec.commandLine().getParseResult();
        if (againstNominal && parse.hasMatchedOption("--slope")) {
            throw new UserInputException("--slope and --against-nominal cannot be used together: against the nominal design there is no target slope");
        }
        if (force && plot == null) {
            throw new UserInputException("--force without --plot: there is no output file to replace");
        }
        FrequencyRange r = bandOptions.range();
        TargetSlope target = bandOptions.target();
        BandFraction fraction = bandOptions.fraction();
        Distribution dist = Distribution.parse(distribution)
                .orElseThrow(() -> new UserInputException("--distribution: expected uniform or gaussian, found '" + distribution + "'"));
        if (trials < 1 || trials > MonteCarlo.MAX_TRIALS) {
            throw new UserInputException("--trials: expected 1 to " + MonteCarlo.MAX_TRIALS + ", found " + trials);
        }
        double limitDb = limitDb(limit);
        int cores = threads == null ? Runtime.getRuntime().availableProcessors() : threads;
        if (cores < 1 || cores > 256) {
            throw new UserInputException("--threads: expected 1 to 256, found " + cores);
        }
        CompareCommand.checkPlotName(plot);
        if (plot != null && !force && java.nio.file.Files.exists(plot)) {
            throw new UserInputException(plot + " already exists; add --force to replace it");
        }
        Design d = DesignReader.read(file);
        CircuitModel.of(d, file.getFileName().toString());
        if (tolerance != null) {
            try {
                d = new Design(d.name(), d.description(), d.stages(),
                        ToleranceOverrides.over(d, ToleranceOverrides.parse(tolerance, d, true)));
            } catch (IllegalArgumentException e) {
                throw new UserInputException("--tolerance: " + e.getMessage());
            }
        }
        MonteCarlo.Spec ms;
        try {
            ms = new MonteCarlo.Spec(d, r, target, fraction, trials, dist, seed, limitDb, cores, againstNominal);
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
        sb.append(Numbers.f("%d trials, %s, seed %d; judged against %s, %s bands%n", s.trials(),
                s.distribution() == Distribution.UNIFORM ? "uniform within ± tolerance"
                        : "Gaussian, σ = tolerance/3, draws beyond ±3σ rejected and redrawn", s.seed(),
                s.againstNominal() ? "the nominal design's own band levels" : "the target " + s.target().describe(),
                s.fraction().displayName()));
        sb.append("Drawn at random: ").append(r.toleranced().isEmpty() ? "none" : String.join(" ", r.toleranced())).append('\n');
        sb.append("Held exact (no tolerance given): ").append(r.exact().isEmpty() ? "none" : String.join(" ", r.exact())).append('\n');
        if (r.toleranced().isEmpty()) {
            sb.append("Nothing was drawn at random, so every trial equals the nominal design: give tolerances with --tolerance "
                    + "or the design's \"tolerance\" map.\n");
        }
        sb.append(Numbers.f("Percentiles: within ±%.4f dB of the exact percentiles of these trials (0.001 dB bins); "
                + "± figures are their standard errors.%n%n", BinnedQuantiles.ERROR_DB));
        Quantiles p = r.peakDb();
        sb.append(Numbers.f("Peak band deviation: nominal ±%.3f dB; 5%% %s, median %s, 95%% %s dB (±%.3f, ±%.3f, ±%.3f); largest %.3f dB%n",
                r.nominalPeakDb(), q(p.p5()), q(p.p50()), q(p.p95()), p.se5(), p.se50(), p.se95(), r.maxPeakDb()));
        sb.append(Numbers.f("Yield (peak band deviation ≤ %.3g dB): %.1f %% ± %.1f %% (binomial standard error)%n%n",
                s.limitDb(), 100 * r.yield(), 100 * r.yieldStandardError()));
        sb.append(Numbers.f("%8s %9s %9s %9s %9s %8s %8s %8s%n", "band", "nominal", "level 5%", "50%", "95%", "dev 5%", "50%", "95%"));
        for (MonteCarlo.BandSpread b : r.bands()) {
            sb.append(Numbers.f("%8s %9.3f %9s %9s %9s %8s %8s %8s%n", b.band().label(), b.nominalLevelDb(),
                    q(b.levelDb().p5()), q(b.levelDb().p50()), q(b.levelDb().p95()), sq(b.deviationDb().p5()),
                    sq(b.deviationDb().p50()), sq(b.deviationDb().p95())));
        }
        sb.append("\nHistogram of the peak band deviation:\n");
        MonteCarlo.Histogram h = r.histogram();
        long most = 1;
        for (long c : h.counts()) {
            most = Math.max(most, c);
        }
        for (int i = 0; i < h.counts().length; i++) {
            sb.append(Numbers.f("  %6.3f–%6.3f dB %8d %s%n", h.edgesDb()[i], h.edgesDb()[i + 1], h.counts()[i],
                    "#".repeat((int) Math.round(40.0 * h.counts()[i] / most))));
        }
        sb.append("\nSensitivity, ranked by contribution = shape sensitivity × tolerance (the shape change, dB, of one part\n"
                + "moving by its whole tolerance); raw: dB per +1 % of value ('shape' = the part not common to all bands;\n"
                + "U1, U2 … are the op-amps' gbwHz, spread by the U tolerance):\n");
        sb.append(Numbers.f("  %-6s %9s %14s %12s %12s%n", "part", "tolerance", "contribution", "raw shape", "raw level"));
        for (MonteCarlo.PartSensitivity ps : r.sensitivities()) {
            sb.append(Numbers.f("  %-6s %9s %14.4f %12.4f %12.4f%n", ps.designator(), ps.tolerance() == null ? "exact" : ps.tolerance().toString(),
                    ps.contributionDb(), ps.maxShapeDb(), ps.maxLevelDb()));
        }
        sb.append("Parts at the top of this list move the shape most within their tolerance: tighten those first.\n");
        return sb.toString();
    }

    /** A percentile, or a refusal when it lies beyond the ±32.8 dB the bins cover. */
    private static String q(double v) {
        return Double.isNaN(v) ? "beyond" : Numbers.f("%.3f", v);
    }

    private static String sq(double v) {
        return Double.isNaN(v) ? "beyond" : Numbers.f("%+.3f", v);
    }

    static String json(MonteCarlo.Result r) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = m.createObjectNode();
        root.put("name", r.spec().design().name());
        root.put("trials", r.spec().trials());
        root.put("distribution", r.spec().distribution().name().toLowerCase(java.util.Locale.ROOT));
        root.put("seed", r.spec().seed());
        root.put("againstNominal", r.spec().againstNominal());
        root.put("quantileErrorDb", BinnedQuantiles.ERROR_DB);
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
            o.put("contributionDb", ps.contributionDb());
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

    /** Percentiles; one beyond the bins' span is written as null (refused, not guessed). */
    private static void quantiles(ObjectNode o, Quantiles q) {
        put(o, "p5", q.p5());
        put(o, "p50", q.p50());
        put(o, "p95", q.p95());
        put(o, "se5", q.se5());
        put(o, "se50", q.se50());
        put(o, "se95", q.se95());
    }

    private static void put(ObjectNode o, String key, double v) {
        if (Double.isNaN(v)) {
            o.putNull(key);
        } else {
            o.put(key, v);
        }
    }
}
