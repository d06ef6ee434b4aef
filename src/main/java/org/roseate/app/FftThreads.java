package org.roseate.app;

import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;
import pl.edu.icm.jlargearrays.ConcurrencyUtils;

/**
 * JTransforms splits long transforms over the thread pool of JLargeArrays' {@link ConcurrencyUtils}.
 * Its default pool is a cached pool of ordinary (non-daemon) threads, which stay alive for 60 s
 * after their last transform and so keep the process running for up to a minute after the window
 * is closed. The window replaces it, once, with the same kind of pool made of daemon threads.
 */
final class FftThreads {
    private static boolean installed;

    private FftThreads() {
    }

    /** Installs the daemon pool (idempotent); call on the FX thread before any analysis starts. */
    static synchronized void useDaemonPool() {
        if (installed) {
            return;
        }
        AtomicInteger n = new AtomicInteger();
        ConcurrencyUtils.setThreadPool(Executors.newCachedThreadPool(r -> {
            Thread t = new Thread(r, "roseate-fft-" + n.incrementAndGet());
            t.setDaemon(true);
            return t;
        }));
        installed = true;
    }
}
