package org.roseate.app;

import java.lang.management.ManagementFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import javafx.application.Platform;
import javafx.scene.Scene;
import javafx.stage.Stage;
import org.roseate.bench.BudgetBench;
import org.roseate.budget.BudgetResult;

/**
 * Issue 17, target 6: the window's two timings, measured in one process as a user meets them (run
 * by {@code src/test/bench/window-timings.sh}, never as a timed unit test).
 *
 * <ol>
 *   <li><b>First curve</b>: from the JVM's start (the runtime's own start time) to the first layout
 *       pulse after the Design view has shown the opening design's curves.</li>
 *   <li><b>Edit → redrawn</b>: the 40-part, 3-op-amp design of {@link BudgetBench} with its source,
 *       so the volts-and-headroom strip is on; each edit steps one resistor one E-series value (as the
 *       component table's + and − do) and is timed from the step to the first layout pulse after both
 *       the design's curves and the budget strip show the edited design.</li>
 * </ol>
 *
 * <p>Prints one line per figure: the first curve in ms, then the median, 90th percentile and
 * maximum of the edits in ms. Arguments: the number of edits (default 60; the first 10 are warm-up
 * and not counted).
 */
public final class WindowTimingProbe {
    private static final int WARM_UP_EDITS = 10;

    private WindowTimingProbe() {
    }

    public static void main(String[] args) throws Exception {
        long jvmStartMs = ManagementFactory.getRuntimeMXBean().getStartTime();
        int edits = args.length > 0 ? Integer.parseInt(args[0]) : 60;
        Path dir = Files.createTempDirectory("roseate-window-timing");
        Path design = dir.resolve("forty-parts.json");
        Files.writeString(design, BudgetBench.fortyPartThreeOpampDesign());
        // Monocle's headless screen defaults to 1280×800, smaller than the window below.
        if (System.getProperty("headless.geometry") == null) {
            System.setProperty("headless.geometry", "1920x1080-32");
        }
        HeadlessFx.activate();
        CountDownLatch done = new CountDownLatch(1);
        Probe probe = new Probe(jvmStartMs, design, edits, done);
        Platform.startup(() -> {
            try {
                probe.start();
            } catch (RuntimeException e) {
                e.printStackTrace();
                System.exit(1);
            }
        });
        if (!done.await(10, TimeUnit.MINUTES)) {
            System.err.println("window timing: timed out");
            System.exit(1);
        }
        probe.report();
        System.exit(0);
    }

    /** The state machine, run on the FX thread only. */
    private static final class Probe {
        private final long jvmStartMs;
        private final Path design;
        private final int edits;
        private final CountDownLatch done;
        private final List<Double> editMs = new ArrayList<>();
        private final List<Double> curvesMs = new ArrayList<>();
        private final List<Double> budgetMs = new ArrayList<>();
        private long curvesAtNanos;
        private long analysisNanos;
        private final List<Double> analysisMs = new ArrayList<>();
        private long budgetAtNanos;
        private MainWindow window;
        private Scene scene;
        private double firstCurveMs = Double.NaN;
        private boolean curvesShown;
        private boolean budgetShown;
        private long editStartNanos;
        private int editIndex = -1;
        private boolean loading;
        private final int parts;
        private final Runnable onPulse = this::pulse;

        Probe(long jvmStartMs, Path design, int edits, CountDownLatch done) {
            this.jvmStartMs = jvmStartMs;
            this.design = design;
            this.edits = edits;
            this.done = done;
            this.parts = org.roseate.circuit.DesignReader.read(design).components().size();
        }

        void start() {
            Stage stage = new Stage();
            stage.setWidth(1600);
            stage.setHeight(1000);
            window = new MainWindow(new ScriptedPrompts(), Path.of("").toAbsolutePath());
            // The views exist once the window is shown; the opening design's analysis reaches the FX
            // thread later (Platform.runLater), so these listeners see it.
            scene = window.show(stage);
            window.design().outcomeProperty().addListener((o, a, b) -> {
                if (b != null && b.ok()) {
                    curvesShown = true;
                    curvesAtNanos = System.nanoTime();
                    analysisNanos = b.elapsedNanos();
                }
            });
            window.budget().resultProperty().addListener((o, a, b) -> {
                budgetShown = b != null;
                budgetAtNanos = System.nanoTime();
            });
            scene.addPostLayoutPulseListener(onPulse);
        }

        private void pulse() {
            if (Double.isNaN(firstCurveMs)) {
                if (curvesShown) {
                    firstCurveMs = System.currentTimeMillis() - jvmStartMs;
                    loading = true;
                    curvesShown = false;
                    budgetShown = false;
                    Platform.runLater(() -> window.design().load(design));
                }
                return;
            }
            if (!(curvesShown && budgetShown && budgetAtNanos >= curvesAtNanos) || !forty()) {
                return;
            }
            if (loading) {
                loading = false;
            } else {
                double ms = (System.nanoTime() - editStartNanos) / 1e6;
                if (editIndex >= WARM_UP_EDITS) {
                    editMs.add(ms);
                    curvesMs.add((curvesAtNanos - editStartNanos) / 1e6);
                    analysisMs.add(analysisNanos / 1e6);
                    budgetMs.add((budgetAtNanos - editStartNanos) / 1e6);
                }
            }
            editIndex++;
            if (editIndex >= edits) {
                scene.removePostLayoutPulseListener(onPulse);
                done.countDown();
                return;
            }
            curvesShown = false;
            budgetShown = false;
            Platform.runLater(() -> {
                editStartNanos = System.nanoTime();
                // R2 up, then down, and so on: the design stays near where it started.
                window.design().step("R2", editIndex % 2 == 0);
            });
        }

        private boolean forty() {
            var out = window.design().outcomeProperty().get();
            BudgetResult b = window.budget().resultProperty().get();
            return out != null && out.ok() && out.design().components().size() == parts && b != null;
        }

        void report() {
            double[] e = editMs.stream().mapToDouble(Double::doubleValue).sorted().toArray();
            System.out.printf(Locale.ROOT, "first curve after JVM start: %.0f ms%n", firstCurveMs);
            if (e.length == 0) {
                System.out.println("edit -> redrawn: no edits timed");
                return;
            }
            System.out.printf(Locale.ROOT, "edit -> redrawn (%d edits, %d-part 3-op-amp design, budget on): median %.1f ms, "
                    + "90th percentile %.1f ms, max %.1f ms%n", e.length, parts, e[e.length / 2],
                    e[Math.min(e.length - 1, (int) Math.ceil(0.9 * e.length) - 1)], e[e.length - 1]);
            System.out.printf(Locale.ROOT, "of which: design analysis (off the FX thread) median %.1f ms; curves applied at median %.1f ms, "
                    + "budget strip at median %.1f ms after the edit%n", median(analysisMs), median(curvesMs), median(budgetMs));
            System.out.println("all edits (ms): " + Arrays.toString(Arrays.stream(e).map(x -> Math.round(x * 10) / 10.0).toArray()));
        }
    }

    private static double median(List<Double> xs) {
        double[] v = xs.stream().mapToDouble(Double::doubleValue).sorted().toArray();
        return v.length == 0 ? Double.NaN : v[v.length / 2];
    }
}
