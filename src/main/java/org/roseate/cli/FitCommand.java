package org.roseate.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
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
import org.roseate.tools.FitResult;
import org.roseate.tools.FitSpec;
import org.roseate.tools.Fitter;
import org.roseate.tools.PartLimits;
import org.roseate.tools.SeriesChoice;
import org.roseate.tools.Topologies;
import org.roseate.value.ComponentKind;
import org.roseate.value.ESeries;
import org.roseate.value.EngineeringValue;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code fit}: component values that follow the target slope, continuous and from standard series. */
@Command(name = "fit", mixinStandardHelpOptions = true,
        description = "Fit component values to the target slope: an inverting ladder (default), a passive divider "
                + "ladder (--divider) or every value of a design file (--from). Minimises the band peak deviation "
                + "plus a tenth of the pointwise peak, then searches neighbouring standard values.")
final class FitCommand implements Callable<Integer> {
    @picocli.CommandLine.Mixin
    BandOptions bandOptions = new BandOptions();

    @Option(names = "--from", paramLabel = "DESIGN.json", description = "fit every component value of this design, keeping its topology")
    Path from;

    @Option(names = "--divider", description = "fit a passive divider ladder instead of an inverting stage")
    boolean divider;

    @Option(names = "--branches", defaultValue = "3", description = "series-RC branches (default: ${DEFAULT-VALUE})")
    int branches;

    @Option(names = "--input-r", paramLabel = "OHMS", description = "fixed input resistor of the inverting stage, e.g. 47k (default: chosen for 0 dB at 1 kHz)")
    String inputR;

    @Option(names = "--load", paramLabel = "OHMS", description = "load resistor across the divider's shunt, e.g. 1M")
    String load;

    @Option(names = "--series", paramLabel = "E24", description = "standard series for R and C (default: E24)")
    String series;

    @Option(names = "--series-r", paramLabel = "E24", description = "standard series for resistors")
    String seriesR;

    @Option(names = "--series-c", paramLabel = "E12", description = "standard series for capacitors")
    String seriesC;

    @Option(names = "--limits", defaultValue = "R=1k-2M2,C=100p-1u", description = "allowed values (default: ${DEFAULT-VALUE})")
    String limits;

    @Option(names = "--starts", description = "continuous starts (default: 4, at least the thread count)")
    Integer starts;

    @Option(names = "--seed", defaultValue = "1", description = "random seed (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--threads", description = "worker threads (default: all cores)")
    Integer threads;

    @Option(names = "--pointwise-weight", defaultValue = "0.1", description = "weight of the pointwise peak in the objective (default: ${DEFAULT-VALUE})")
    double pointwiseWeight;

    @Option(names = {"-o", "--output"}, paramLabel = "OUT.json", description = "write the standard-value design here")
    Path output;

    @Option(names = "--force", description = "replace an existing output file")
    boolean force;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        FrequencyRange r = bandOptions.range();
        TargetSlope target = bandOptions.target();
        BandFraction fraction = bandOptions.fraction();
        PartLimits lim;
        try {
            lim = PartLimits.parse(limits);
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--limits: " + e.getMessage());
        }
        ESeries both = series(series, "--series", ESeries.E24);
        SeriesChoice choice = new SeriesChoice(series(seriesR, "--series-r", both), series(seriesC, "--series-c", both));
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
        Design start;
        List<String> free = new ArrayList<>();
        Optional<String> gain = Optional.empty();
        if (from != null) {
            start = DesignReader.read(from);
            for (Component c : start.components()) {
                if (c.kind() == ComponentKind.INDUCTOR) {
                    throw new UserInputException(from.getFileName() + ": " + c.designator() + " is an inductor; fit handles R and C only");
                }
                free.add(c.designator());
            }
            start = start.withValues(clampedValues(start, lim));
        } else if (divider) {
            start = Topologies.dividerLadder(branches, optionalOhms(load, "--load"), lim, r);
            String loadName = start.stages().get(0).networks().containsKey("load")
                    ? start.stages().get(0).networks().get("load").components().get(0).designator() : "";
            start.components().stream().map(Component::designator).filter(d -> !d.equals(loadName)).forEach(free::add);
        } else {
            OptionalDouble rin = optionalOhms(inputR, "--input-r");
            start = Topologies.invertingLadder(branches, rin, Optional.empty(), lim, r);
            start.components().stream().map(Component::designator).filter(d -> !d.equals("R1")).forEach(free::add);
            if (rin.isEmpty()) {
                gain = Optional.of("R1");
            }
        }
        FitSpec fs = new FitSpec(start, free, gain, r, target, fraction, choice, lim, n, seed, cores, pointwiseWeight);
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
        PrintWriter out = spec.commandLine().getOut();
        out.print(report(res, fs));
        out.flush();
        if (output != null) {
            try {
                AtomicOutput.writeString(output, DesignWriter.toJson(res.snapped()), force);
            } catch (org.roseate.io.OutputExistsException e) {
                throw new UserInputException(e.getMessage());
            } catch (IOException e) {
                throw new UserInputException(output + ": " + e.getMessage());
            }
            out.println("Wrote " + output);
        }
        return 0;
    }

    private static java.util.Map<String, Double> clampedValues(Design d, PartLimits lim) {
        java.util.Map<String, Double> m = new java.util.HashMap<>();
        for (Component c : d.components()) {
            m.put(c.designator(), Math.max(lim.min(c.kind()), Math.min(lim.max(c.kind()), c.value())));
        }
        return m;
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

    static String report(FitResult res, FitSpec fs) {
        StringBuilder sb = new StringBuilder();
        DesignAnalysis c = res.continuousAnalysis();
        DesignAnalysis s = res.snappedAnalysis();
        sb.append("Fit: ").append(res.snapped().name()).append('\n');
        sb.append(Numbers.f("Target: %s over %s – %s, %s bands; series R %s, C %s; limits %s%n", fs.target().describe(),
                Numbers.hz(fs.range().loHz()), Numbers.hz(fs.range().hiHz()), fs.fraction().displayName(),
                fs.series().resistors(), fs.series().capacitors(), fs.limits()));
        sb.append(Numbers.f("Objective: band peak + %.3g × pointwise peak; %d starts, seed %d, %d evaluations, %.1f s%n%n",
                fs.pointwiseWeight(), fs.starts(), fs.seed(), res.evaluations(), res.elapsedSeconds()));
        sb.append(Numbers.f("%-28s %14s %14s%n", "", "continuous", "standard"));
        sb.append(Numbers.f("%-28s %14.4f %14.4f%n", "peak band deviation, ±dB", c.bands().maxBandDeviationDb(), s.bands().maxBandDeviationDb()));
        sb.append(Numbers.f("%-28s %14.4f %14.4f%n", "peak deviation, ±dB", c.slope().maxDeviationDb(), s.slope().maxDeviationDb()));
        sb.append(Numbers.f("%-28s %14.4f %14.4f%n%n", "slope, dB/octave", c.slope().slopeDbPerOctave(), s.slope().slopeDbPerOctave()));
        sb.append(Numbers.f("%-6s %14s %10s %10s%n", "part", "continuous", "standard", "change"));
        List<Component> cont = res.continuous().components();
        List<Component> snap = res.snapped().components();
        for (int i = 0; i < snap.size(); i++) {
            Component a = cont.get(i);
            Component b = snap.get(i);
            boolean fixed = !fs.free().contains(b.designator()) && fs.gainResistor().map(g -> !g.equals(b.designator())).orElse(true);
            sb.append(Numbers.f("%-6s %14s %10s %9s%n", b.designator(), EngineeringValue.formatSi(a.value(), a.kind()),
                    EngineeringValue.format(b.value(), b.kind()),
                    fixed ? "fixed" : Numbers.f("%+.1f%%", 100 * (b.value() / a.value() - 1))));
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
