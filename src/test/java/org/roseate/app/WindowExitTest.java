package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The process ends soon after the window closes: {@link WindowExitMain} runs in its own JVM,
 * measures a file (so JTransforms' pool and the window's executors have threads), closes the
 * window, and the test times how long the JVM takes to end after that. JLargeArrays' default pool
 * kept idle non-daemon threads for 60 s, so a leak shows as a wait of about a minute; the bound is
 * the two seconds.
 */
class WindowExitTest {
    /** The limit from the close to the end of the process, ms. */
    static final long EXIT_WITHIN_MS = 2000;

    @TempDir
    Path dir;

    @Test
    void theProcessEndsWithinTwoSecondsOfTheClose() throws Exception {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"),
                WindowExitMain.class.getName(), dir.toString());
        pb.redirectErrorStream(true);
        pb.environment().remove("DISPLAY"); // Monocle, as in the other UI tests
        Process p = pb.start();
        List<String> out = new ArrayList<>();
        long closedAt = -1;
        try (BufferedReader r = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8))) {
            String line;
            while ((line = r.readLine()) != null) {
                out.add(line);
                if (line.equals("closing")) {
                    closedAt = System.nanoTime();
                    break;
                }
            }
            assertTrue(closedAt > 0, "the window never got to close: " + String.join("\n", out));
            boolean ended = p.waitFor(90, TimeUnit.SECONDS);
            long ms = (System.nanoTime() - closedAt) / 1_000_000;
            if (!ended) {
                p.destroyForcibly();
            }
            System.out.println("process ended " + ms + " ms after the close");
            assertTrue(ended && ms <= EXIT_WITHIN_MS, "the process ended " + ms + " ms after the close (" + out + ")");
            assertEquals(0, p.exitValue());
        } finally {
            if (p.isAlive()) {
                p.destroyForcibly();
            }
        }
    }
}
