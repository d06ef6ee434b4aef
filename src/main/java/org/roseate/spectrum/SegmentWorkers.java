package org.roseate.spectrum;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.ThreadPoolExecutor;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * The process-wide helper threads that transform Welch segments in parallel for long file jobs
 * ({@link WelchEstimator#transformInParallel}). Created on first use; one thread fewer than the
 * available processors (the caller's thread transforms a share too), at most three. The threads are
 * daemon threads and end after two idle seconds, so none outlives its job for long nor holds the JVM
 * open (a window closing or a command ending never waits for them).
 */
final class SegmentWorkers {
    private static final int HELPERS = Math.max(0, Math.min(3, Runtime.getRuntime().availableProcessors() - 1));
    private static ExecutorService pool;

    private SegmentWorkers() {
    }

    /** Helper threads available (0 on one processor: parallel transforms are then off). */
    static int helpers() {
        return HELPERS;
    }

    static synchronized ExecutorService pool() {
        if (pool == null) {
            AtomicInteger count = new AtomicInteger();
            ThreadPoolExecutor p = new ThreadPoolExecutor(HELPERS, HELPERS, 2, TimeUnit.SECONDS,
                    new LinkedBlockingQueue<>(), r -> {
                        Thread t = new Thread(r, "roseate-welch-" + count.incrementAndGet());
                        t.setDaemon(true);
                        return t;
                    });
            p.allowCoreThreadTimeOut(true);
            pool = p;
        }
        return pool;
    }
}
