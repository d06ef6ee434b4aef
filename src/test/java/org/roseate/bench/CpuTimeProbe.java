package org.roseate.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.function.DoubleSupplier;

/**
 * Thread CPU time of the benchmark bodies, for a shared machine where JMH's wall-clock scores mostly
 * measure the wait for a core: each body is run warm, then timed with
 * {@link ThreadMXBean#getCurrentThreadCpuTime()} (which counts only this thread's time on a core) and
 * the best of the repeats is printed. The warm-up is long (100 calls of the chain bodies) because on a
 * loaded machine the compiler threads wait for a core too, and a short warm-up times interpreted code. JMH stays the reference method; this is the load-independent
 * figure beside it. Usage: {@code java -cp ... org.roseate.bench.CpuTimeProbe [dataDir [cascade,chain,live]]}
 * (each benchmark is best run in its own JVM, so that one does not shape the compiled code of the next).
 */
public final class CpuTimeProbe {
    private static final ThreadMXBean BEAN = ManagementFactory.getThreadMXBean();
    private static double sink;

    private CpuTimeProbe() {
    }

    /** Best-of-{@code repeats} CPU milliseconds per call of {@code body}, after {@code warm} untimed calls. */
    static double bestCpuMs(DoubleSupplier body, int warm, int repeats, int callsPerRepeat) {
        for (int i = 0; i < warm; i++) {
            sink += body.getAsDouble();
        }
        double best = Double.POSITIVE_INFINITY;
        for (int r = 0; r < repeats; r++) {
            long t0 = BEAN.getCurrentThreadCpuTime();
            for (int i = 0; i < callsPerRepeat; i++) {
                sink += body.getAsDouble();
            }
            best = Math.min(best, (BEAN.getCurrentThreadCpuTime() - t0) / 1e6 / callsPerRepeat);
        }
        return best;
    }

    public static void main(String[] args) throws Exception {
        String dataDir = args.length > 0 ? args[0] : "target/bench-data";
        java.util.List<String> which = java.util.List.of((args.length > 1 ? args[1] : "cascade,chain,live").split(","));
        if (which.contains("cascade")) {
            cascade(dataDir);
        }
        if (which.contains("chain")) {
            chain();
        }
        if (which.contains("live")) {
            live();
        }
        if (sink == 42.4242) {
            System.out.println(sink);
        }
    }

    private static void cascade(String dataDir) throws Exception {
        SosCascadeBench cascade = new SosCascadeBench();
        cascade.dataDir = dataDir;
        cascade.setup();
        double cascadeMs = bestCpuMs(() -> cascade.cascade()[0], 60, 30, 1);
        System.out.printf("SosCascadeBench.cascade: %.2f ms CPU per 2^20 samples = %.1f section-samples/us%n",
                cascadeMs, 8.0 * BenchData.SIGNAL_SAMPLES / (cascadeMs * 1e3));
    }

    private static void chain() {
        ChainBench chain = new ChainBench();
        chain.design = "eight-sections";
        chain.setup();
        double chainMs = bestCpuMs(chain::oneSecondStereo, 100, 40, 1);
        System.out.printf("ChainBench.oneSecondStereo[eight-sections]: %.2f ms CPU per second of audio = %.2f %% of one core%n",
                chainMs, chainMs / 10);
    }

    private static void live() {
        LiveChainBench live = new LiveChainBench();
        live.setup();
        double liveMs = bestCpuMs(live::eightSectionsWithLiveAnalyzer, 100, 40, 1);
        System.out.printf("LiveChainBench.eightSectionsWithLiveAnalyzer: %.2f ms CPU per second of audio = %.2f %% of one core%n",
                liveMs, liveMs / 10);
    }
}
