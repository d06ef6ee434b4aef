package org.roseate.tools;

import java.nio.file.Path;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;

/**
 * Runs a Monte Carlo of args[0] trials on the bench preset in octave bands and prints the 95th
 * percentile of the peak deviation; started in a JVM with a small heap by
 * {@link ToleranceMemoryTest}, and by hand for the 10⁷-trial figure in the README.
 */
public final class ToleranceMemoryMain {
    private ToleranceMemoryMain() {
    }

    public static void main(String[] args) {
        int trials = Integer.parseInt(args[0]);
        BandFraction fraction = args.length > 1 && args[1].equals("third") ? BandFraction.THIRD_OCTAVE : BandFraction.OCTAVE;
        Design d = DesignReader.read(Path.of("presets/bench-pink.json"));
        long t0 = System.nanoTime();
        MonteCarlo.Result r = MonteCarlo.run(new MonteCarlo.Spec(d, FrequencyRange.AUDIO, TargetSlope.PINK, fraction,
                trials, Distribution.UNIFORM, 1, 0.5, Runtime.getRuntime().availableProcessors(), false), f -> { });
        Runtime rt = Runtime.getRuntime();
        System.out.printf(java.util.Locale.ROOT, "trials %d p95 %.4f yield %.4f seconds %.1f heapUsedMB %.1f maxHeapMB %.1f%n",
                trials, r.peakDb().p95(), r.yield(), (System.nanoTime() - t0) / 1e9,
                (rt.totalMemory() - rt.freeMemory()) / 1e6, rt.maxMemory() / 1e6);
    }
}
