package org.roseate.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.stream.Collectors;
import java.util.concurrent.Callable;
import java.util.function.DoubleConsumer;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.circuit.DesignWriter;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.io.AtomicOutput;
import org.roseate.model.CircuitModel;
import org.roseate.tools.FitPlan;
import org.roseate.tools.FitResult;
import org.roseate.tools.GainHold;
import org.roseate.tools.ToleranceOverrides;
import org.roseate.tools.FitSpec;
import org.roseate.tools.Fitter;
import org.roseate.tools.PartLimits;
import org.roseate.tools.SeriesChoice;
import org.roseate.tools.Topologies;
import org.roseate.value.ComponentKind;
import org.roseate.value.ESeries;
import org.roseate.value.EngineeringValue;
import org.roseate.value.Tolerance;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code fit}: component values that follow the target slope, continuous and from standard series. */
@Command(name = "fit", mixinStandardHelpOptions = true,
        description = {"Fit component values to the target slope: an inverting ladder (default), a passive divider "
                + "ladder (--divider) or the values of a design file (--from). Minimises the band peak deviation "
                + "plus a tenth of the pointwise peak and the distance from a held gain, then searches neighbouring "
                + "standard values.",
            "Only the parts it is asked to change move: --hold keeps parts; --from keeps the input part and the "
                + "design's own gain at 1 kHz unless told otherwise (--free-input, --gain-db).",
            "Standard series: E24 for resistors and E12 for capacitors by default (common practice: E24 resistors "
                + "and E12 capacitors are what most suppliers stock)."})
final class FitCommand implements Callable<Integer> {
    @picocli.CommandLine.Mixin
    BandOptions bandOptions = new BandOptions();

    @Option(names = "--from", paramLabel = "DESIGN.json", description = "fit the values of this design, keeping its topology, its input part and its gain at 1 kHz")
    Path from;

    @Option(names = "--divider", description = "fit a passive divider ladder instead of an inverting stage")
    boolean divider;

    @Option(names = "--branches", defaultValue = "3", description = "series-RC branches of a new ladder (default: ${DEFAULT-VALUE})")
    int branches;

    @Option(names = "--input-r", paramLabel = "OHMS", description = "fixed input resistor of a new inverting ladder, e.g. 47k (default: free, chosen with the rest)")
    String inputR;

    @Option(names = "--load", paramLabel = "OHMS", description = "load resistor across a new divider's shunt, e.g. 1M")
    String load;

    @Option(names = "--hold", paramLabel = "R1,C2", split = ",", description = "parts that keep their values exactly")
    List<String> hold = new ArrayList<>();

    @Option(names = "--free-input", description = "with --from: let the fit change the input part too")
    boolean freeInput;

    @Option(names = "--gain-db", paramLabel = "G@F|free",
            description = "hold a gain of G dB at F Hz, e.g. 40@1k, or 'free' to fit the shape alone (default: the design's own gain at 1 kHz "
                    + "with --from, 0 dB at 1 kHz for a new inverting ladder, free for a divider)")
    String gainDb;

    @Option(names = "--tolerance", paramLabel = "R=1%,C=5%", description = "tolerances written into the output design (per kind letter or designator, over the file's own)")
    String tolerance;

    @Option(names = "--series", paramLabel = "E24", description = "standard series for both R and C (default: E24 for R, E12 for C)")
    String series;

    @Option(names = "--series-r", paramLabel = "E24", description = "standard series for resistors (default: E24, or --series)")
    String seriesR;

    @Option(names = "--series-c", paramLabel = "E12", description = "standard series for capacitors (default: E12, or --series)")
    String seriesC;

    @Option(names = "--limits", defaultValue = "R=1k-2M2,C=100p-1u", description = "allowed values of the free parts (default: ${DEFAULT-VALUE})")
    String limits;

    @Option(names = "--starts", description = "continuous starts (default: 4, at least the thread count)")
    Integer starts;

    @Option(names = "--seed", defaultValue = "1", description = "random seed (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--threads", description = "worker threads (default: all cores; results do not depend on it)")
    Integer threads;

    @Option(names = "--pointwise-weight", defaultValue = "0.1", description = "weight of the pointwise peak in the objective (default: ${DEFAULT-VALUE})")
    double pointwiseWeight;

    @Option(names = "--with-source", description = "with --from: judge source × circuit, |H|² times the design file's \"source\" "
            + "density shape 1 + fc/f, as analyze --with-source does")
    boolean withSource;

    @Option(names = {"-o", "--output"}, paramLabel = "OUT.json", description = "write the standard-value design here")
    Path output;

    @Option(names = "--force", description = "replace an existing output file")
    boolean force;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    private boolean given(String option) {
        return spec.commandLine().getParseResult().hasMatchedOption(option);
    }

    private void refuseWith(String option, String other, String why) {
        if (given(option) && given(other)) {
            throw new UserInputException(option + " and " + other + " cannot be used together: " + why);
        }
    }

    @Override
    public Integer call() {
        refuseWith("--from", "--divider", "--from keeps the design's own topology");
        refuseWith("--from", "--branches", "--from keeps the design's own topology");
        refuseWith("--from", "--input-r", "--from keeps the design's input part (free it with --free-input, or --hold it)");
        refuseWith("--from", "--load", "--from keeps the design's own topology");
        refuseWith("--divider", "--input-r", "a divider has no input resistor of an op-amp stage");
        if (given("--load") && !divider) {
            throw new UserInputException("--load applies to a divider ladder only; add --divider");
        }
        if (freeInput && from == null) {
            throw new UserInputException("--free-input applies to --from only (a new ladder's input resistor is free unless --input-r fixes it)");
        }
        if (withSource && from == null) {
            throw new UserInputException("--with-source applies to --from only: a new ladder has no design file with a \"source\"");
        }
        if (force && output == null) {
            throw new UserInputException("--force without -o: there is no output file to replace");
        }
        FrequencyRange r = bandOptions.range();
        TargetSlope target = bandOptions.target();
        BandFraction fraction = bandOptions.fraction();
        PartLimits lim;
        try {
            lim = PartLimits.parse(limits);
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--limits: " + e.getMessage());
        }
        ESeries rDefault = series(series, "--series", ESeries.E24);
        ESeries cDefault = series(series, "--series", ESeries.E12);
        SeriesChoice choice = new SeriesChoice(series(seriesR, "--series-r", rDefault), series(seriesC, "--series-c", cDefault));
        int cores = threads == null ? Runtime.getRuntime().availableProcessors() : threads;
        if (cores < 1 || cores > 256) {
            throw new UserInputException("--threads: expected 1 to 256, found " + cores);
        }
        int n = starts == null ? Math.max(4, cores) : starts;
        if (n < 1 || n > 1000) {
            throw new UserInputException("--starts: expected 1 to 1000, found " + n);
        }
        if (branches < 1 || branches > 12) {
            throw new UserInputException("--branches: expected 1 to 12, found " + branches);
        }
        if (!(pointwiseWeight >= 0) || pointwiseWeight > 100) {
            throw new UserInputException("--pointwise-weight: expected 0 to 100, found " + pointwiseWeight);
        }
        if (output != null) {
            if (!output.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".json")) {
                throw new UserInputException("-o " + output + ": expected a .json design file");
            }
            if (!force && java.nio.file.Files.exists(output)) {
                throw new UserInputException(output + " already exists; add --force to replace it");
            }
        }
        Design start;
        Set<String> held = new LinkedHashSet<>();
        Optional<GainHold> gain;
        if (from != null) {
            start = DesignReader.read(from);
            CircuitModel.of(start, from.getFileName().toString());
            if (withSource && start.source().isEmpty()) {
                throw new UserInputException(from.getFileName() + ": --with-source needs a \"source\" in the design file, such as "
                        + "\"source\": {\"densityVPerRtHz\": 150e-6, \"flickerCornerHz\": 250}");
            }
            if (!freeInput) {
                held.addAll(Topologies.inputParts(start));
            }
            gain = FitPlan.ownGain(start);
        } else if (divider) {
            start = Topologies.dividerLadder(branches, optionalOhms(load, "--load"), lim, r);
            if (start.stages().get(0).networks().containsKey("load")) {
                start.stages().get(0).networks().get("load").components().forEach(c -> held.add(c.designator()));
            }
            gain = Optional.empty();
        } else {
            OptionalDouble rin = optionalOhms(inputR, "--input-r");
            start = Topologies.invertingLadder(branches, rin, Optional.empty(), lim, r);
            if (rin.isPresent()) {
                held.add("R1");
            }
            gain = Optional.of(new GainHold(0, 1000));
        }
        if (gainDb != null) {
            if (gainDb.trim().equalsIgnoreCase("free")) {
                gain = Optional.empty();
            } else {
                try {
                    gain = Optional.of(GainHold.parse(gainDb));
                } catch (IllegalArgumentException e) {
                    throw new UserInputException("--gain-db: " + e.getMessage());
                }
            }
        }
        for (String h : hold) {
            String d = h.trim();
            if (start.component(d).isEmpty()) {
                throw new UserInputException("--hold: no part '" + d + "' in " + (from != null ? from.getFileName().toString() : "the new ladder")
                        + "; its parts are " + start.components().stream().map(Component::designator).collect(Collectors.joining(" ")));
            }
            held.add(d);
        }
        FitPlan plan = FitPlan.of(start, held);
        held.addAll(plan.inductors());
        List<String> inductors = plan.inductors();
        List<String> free = plan.free();
        if (free.isEmpty()) {
            throw new UserInputException("--hold: every part is held; there is nothing left to fit");
        }
        Map<String, Tolerance> tolerances = Map.of();
        if (tolerance != null) {
            try {
                tolerances = ToleranceOverrides.parse(tolerance, start, false);
            } catch (IllegalArgumentException e) {
                throw new UserInputException("--tolerance: " + e.getMessage());
            }
        }
        FitSpec fs;
        try {
            fs = new FitSpec(start, free, gain, r, target, fraction, choice, lim, n, seed, cores, pointwiseWeight,
                    withSource ? start.source() : Optional.empty());
        } catch (IllegalArgumentException e) {
            throw new UserInputException(e.getMessage());
        }
        PrintWriter err = spec.commandLine().getErr();
        ProgressBar bar = ProgressBar.forTerminal(err, "fitting");
        FitResult res;
        try {
            res = Fitter.fit(fs, bar);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(e.getMessage());
        } finally {
            bar.finish();
        }
        Design written = res.snapped();
        if (from != null) {
            written = written.withName(written.name() + " (refitted)",
                    "Values refitted by roseate fit from " + from.getFileName() + "; held: "
                            + (held.isEmpty() ? "none" : String.join(" ", held)) + ".");
        }
        written = new Design(written.name(), written.description(), written.stages(), ToleranceOverrides.over(written, tolerances),
                written.source(), written.temperatureC());
        PrintWriter out = spec.commandLine().getOut();
        out.print(report(res, fs, new ArrayList<>(held), inductors));
        out.flush();
        if (output != null) {
            try {
                AtomicOutput.writeString(output, DesignWriter.toJson(written), force);
            } catch (org.roseate.io.OutputExistsException e) {
                throw new UserInputException(e.getMessage());
            } catch (IOException e) {
                throw new UserInputException(output + ": " + e.getMessage());
            }
            out.println("Wrote " + output + (written.tolerances().isEmpty() ? " (no tolerances: give them with --tolerance)"
                    : " with tolerances " + written.tolerances()));
        }
        return 0;
    }

    private static ESeries series(String text, String option, ESeries fallback) {
        if (text == null) {
            return fallback;
        }
        return ESeries.parse(text).orElseThrow(() -> new UserInputException(option + ": expected a series E3, E6, E12, E24, E48, E96 or E192, found '" + text + "'"));
    }

    private static OptionalDouble optionalOhms(String text, String option) {
        if (text == null) {
            return OptionalDouble.empty();
        }
        try {
            return OptionalDouble.of(EngineeringValue.parse(text, ComponentKind.RESISTOR));
        } catch (IllegalArgumentException e) {
            throw new UserInputException(option + ": " + e.getMessage());
        }
    }

    static String report(FitResult res, FitSpec fs, List<String> held, List<String> inductors) {
        StringBuilder sb = new StringBuilder();
        DesignAnalysis c = res.continuousAnalysis();
        DesignAnalysis s = res.snappedAnalysis();
        sb.append("Fit: ").append(res.snapped().name()).append('\n');
        sb.append(Numbers.f("Target: %s over %s – %s, %s bands; series R %s, C %s; limits %s%n", fs.target().describe(),
                Numbers.hz(fs.range().loHz()), Numbers.hz(fs.range().hiHz()), fs.fraction().displayName(),
                fs.series().resistors(), fs.series().capacitors(), fs.limits()));
        sb.append(Numbers.f("Objective: band peak + %.3g × pointwise peak%s; %d starts, seed %d, %d evaluations, %.1f s%n",
                fs.pointwiseWeight(), fs.gain().isPresent() ? Numbers.f(" + %.3g × |gain error|", Fitter.GAIN_WEIGHT) : "",
                fs.starts(), fs.seed(), res.evaluations(), res.elapsedSeconds()));
        fs.source().ifPresent(src -> sb.append(Numbers.f("Judged with the source: levels of source × circuit relative to the "
                + "source's white density (1/f corner %s Hz)%n", Numbers.plain(src.flickerCornerHz()))));
        sb.append("Held (unchanged): ").append(held.isEmpty() ? "none" : String.join(" ", held)).append('\n');
        if (!inductors.isEmpty()) {
            sb.append("Inductors are held (fit frees resistors and capacitors only): ").append(String.join(" ", inductors)).append('\n');
        }
        double atHz = fs.gain().map(GainHold::atHz).orElse(1000.0);
        if (fs.gain().isPresent()) {
            sb.append(Numbers.f("Gain held: %.2f dB at %s%n", fs.gain().get().gainDb(), Numbers.hz(atHz)));
        } else {
            sb.append("Gain: not held (the shape alone was fitted; --gain-db G@F holds one)\n");
        }
        for (FitResult.ClampedValue cv : res.clamped()) {
            ComponentKind k = fs.start().component(cv.designator()).orElseThrow().kind();
            sb.append(Numbers.f("Clamped into the limits before fitting: %s %s -> %s%n", cv.designator(),
                    EngineeringValue.format(cv.fromValue(), k), EngineeringValue.format(cv.toValue(), k)));
        }
        if (!res.atLimit().isEmpty()) {
            sb.append("At a limit after fitting (the fit wanted to go further; see --limits): ")
                    .append(String.join(" ", res.atLimit())).append('\n');
        }
        sb.append('\n');
        sb.append(Numbers.f("%-28s %14s %14s %14s%n", "", "start", "continuous", "standard"));
        sb.append(Numbers.f("%-28s %14s %14.4f %14.4f%n", "peak band deviation, ±dB", "", c.bands().maxBandDeviationDb(), s.bands().maxBandDeviationDb()));
        sb.append(Numbers.f("%-28s %14s %14.4f %14.4f%n", "peak deviation, ±dB", "", c.slope().maxDeviationDb(), s.slope().maxDeviationDb()));
        sb.append(Numbers.f("%-28s %14s %14.4f %14.4f%n", "slope, dB/octave", "", c.slope().slopeDbPerOctave(), s.slope().slopeDbPerOctave()));
        sb.append(Numbers.f("%-28s %14.3f %14.3f %14.3f%n", "gain at " + Numbers.hz(atHz) + ", dB", res.startGainDb(),
                res.continuousGainDb(), res.snappedGainDb()));
        sb.append(Numbers.f("Snapping to standard values moved the gain by %+.3f dB.%n%n", res.snappedGainDb() - res.continuousGainDb()));
        sb.append(Numbers.f("%-6s %10s %14s %10s %10s%n", "part", "start", "continuous", "standard", "change"));
        List<Component> first = fs.start().components();
        List<Component> cont = res.continuous().components();
        List<Component> snap = res.snapped().components();
        for (int i = 0; i < snap.size(); i++) {
            Component a = cont.get(i);
            Component b = snap.get(i);
            boolean fixed = !fs.free().contains(b.designator());
            sb.append(Numbers.f("%-6s %10s %14s %10s %10s%n", b.designator(), EngineeringValue.format(first.get(i).value(), b.kind()),
                    EngineeringValue.formatSi(a.value(), a.kind()), EngineeringValue.format(b.value(), b.kind()),
                    fixed ? "held" : Numbers.f("%+.1f%%", 100 * (b.value() / a.value() - 1))));
        }
        sb.append('\n').append("Standard-value design:\n");
        res.snapped().stages().forEach(st -> st.networks().forEach((role, net) ->
                sb.append("  ").append(st.kind()).append(' ').append(role).append(": ").append(net.toExpression()).append('\n')));
        sb.append("Figures above are from an independent analysis of the designs (the exact model), as `analyze` prints them.\n");
        return sb.toString();
    }

    /**
     * A one-line progress bar on stderr, drawn only when the console is a terminal (so tests and
     * pipes stay clean). Thread-safe; redraws at most at each whole percent.
     */
    static final class ProgressBar implements DoubleConsumer {
        private final PrintWriter err;
        private final String label;
        private final boolean active;
        private int shown = -1;

        private ProgressBar(PrintWriter err, String label, boolean active) {
            this.err = err;
            this.label = label;
            this.active = active;
        }

        static ProgressBar forTerminal(PrintWriter err, String label) {
            return new ProgressBar(err, label, System.console() != null);
        }

        @Override
        public synchronized void accept(double fraction) {
            int pct = (int) Math.max(0, Math.min(100, Math.floor(fraction * 100)));
            if (!active || pct <= shown) {
                return;
            }
            shown = pct;
            int filled = pct * 30 / 100;
            err.print(String.format(Locale.ROOT, "\r%s [%s%s] %3d%%", label, "#".repeat(filled), ".".repeat(30 - filled), pct));
            err.flush();
        }

        synchronized void finish() {
            if (active && shown >= 0) {
                err.print("\r" + " ".repeat(label.length() + 40) + "\r");
                err.flush();
            }
        }
    }
}
