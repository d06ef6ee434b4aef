package org.roseate.audio;

import java.util.function.LongSupplier;

/**
 * A thread that watches a progress counter and acts once when it has not moved for a timeout.
 *
 * <p>Why a thread of its own: when the sound server dies, Java Sound throws nothing; a blocking
 * {@code write} or {@code read} may simply never return, or return 0 for ever, and the line stays
 * "active". The only sign is that nothing moves, and only another thread can see that and close the
 * line to set the stuck one free.
 */
final class Watchdog {
    private final Thread thread;
    private volatile boolean stopped;

    /**
     * @param name          thread name
     * @param progress      a counter that grows while the device works (read from this thread)
     * @param timeoutNanos  how long without growth counts as a stall
     * @param onStall       run once, on this thread, when a stall is seen
     */
    Watchdog(String name, LongSupplier progress, long timeoutNanos, Runnable onStall) {
        long pollMillis = Math.max(5, Math.min(100, timeoutNanos / 10_000_000));
        thread = new Thread(() -> {
            long last = progress.getAsLong();
            long lastChange = System.nanoTime();
            while (!stopped) {
                try {
                    Thread.sleep(pollMillis);
                } catch (InterruptedException e) {
                    return;
                }
                long now = System.nanoTime();
                long p = progress.getAsLong();
                if (p != last) {
                    last = p;
                    lastChange = now;
                } else if (now - lastChange >= timeoutNanos && !stopped) {
                    onStall.run();
                    return;
                }
            }
        }, name);
        thread.setDaemon(true);
    }

    void start() {
        thread.start();
    }

    /** Stops watching (the stall action will not run after this returns, unless already running). */
    void stop() {
        stopped = true;
        thread.interrupt();
    }
}
