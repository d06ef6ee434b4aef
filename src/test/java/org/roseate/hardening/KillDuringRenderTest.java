package org.roseate.hardening;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeFalse;

import java.io.File;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;

/**
 * Nothing lost: {@code roseate render presets/bench-pink.json -o OUT.wav --seconds 600} in a child
 * JVM, killed about a second into the render. The output appears only complete (AtomicOutput's
 * contract): after SIGKILL there is no OUT.wav and an existing one given with --force keeps its old
 * bytes; after SIGTERM the shutdown hook also removes the temporary file.
 */
@Timeout(value = 60, unit = TimeUnit.SECONDS)
class KillDuringRenderTest {
    private static final byte[] OLD = "old content, must survive".getBytes(StandardCharsets.US_ASCII);

    @TempDir
    Path dir;

    @Test
    void sigkillLeavesNoTarget() throws Exception {
        Path out = dir.resolve("OUT.wav");
        Process p = startRender(out, false);
        killWhileRendering(p, out, true);
        assertFalse(Files.exists(out), "no OUT.wav after SIGKILL mid-render");
    }

    @Test
    void sigkillKeepsTheOldFileGivenWithForce() throws Exception {
        Path out = dir.resolve("OUT.wav");
        Files.write(out, OLD);
        Process p = startRender(out, true);
        killWhileRendering(p, out, true);
        assertEquals(new String(OLD, StandardCharsets.US_ASCII), Files.readString(out, StandardCharsets.US_ASCII),
                "the existing OUT.wav keeps its old content after SIGKILL");
    }

    @Test
    void sigtermLeavesNeitherTargetNorTemporaryFile() throws Exception {
        assumeFalse(System.getProperty("os.name").toLowerCase().contains("win"), "destroy() is forcible on Windows");
        Path out = dir.resolve("OUT.wav");
        Process p = startRender(out, false);
        killWhileRendering(p, out, false);
        assertFalse(Files.exists(out), "no OUT.wav after SIGTERM mid-render");
        assertEquals(List.of(), temporaries(out), "the shutdown hook removes the temporary file on SIGTERM");
    }

    @Test
    void sigtermKeepsTheOldFileGivenWithForce() throws Exception {
        assumeFalse(System.getProperty("os.name").toLowerCase().contains("win"), "destroy() is forcible on Windows");
        Path out = dir.resolve("OUT.wav");
        Files.write(out, OLD);
        Process p = startRender(out, true);
        killWhileRendering(p, out, false);
        assertEquals(new String(OLD, StandardCharsets.US_ASCII), Files.readString(out, StandardCharsets.US_ASCII));
        assertEquals(List.of(), temporaries(out));
    }

    private static Process startRender(Path out, boolean force) throws IOException {
        String java = System.getProperty("java.home") + File.separator + "bin" + File.separator + "java";
        List<String> cmd = new java.util.ArrayList<>(List.of(java, "-cp", System.getProperty("java.class.path"),
                "org.roseate.Main", "render", "presets/bench-pink.json", "-o", out.toString(), "--seconds", "600"));
        if (force) {
            cmd.add("--force");
        }
        return new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
    }

    /**
     * Waits until the render is writing (its temporary file exists), lets it run about a second,
     * checks it is still running (600 s of audio takes far longer) and kills it.
     */
    private static void killWhileRendering(Process p, Path out, boolean forcibly) throws Exception {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
        while (temporaries(out).isEmpty()) {
            assertTrue(p.isAlive(), "render ended before writing (exit " + (p.isAlive() ? "" : p.exitValue()) + ")");
            assertTrue(System.nanoTime() < deadline, "render did not start writing within 30 s");
            Thread.sleep(20);
        }
        Thread.sleep(1000);
        assertTrue(p.isAlive(), "render finished within a second; the kill would test nothing");
        long size = Files.size(temporaries(out).get(0));
        assertTrue(size > 44, "the render had written samples before the kill: " + size + " bytes");
        if (forcibly) {
            p.destroyForcibly();
        } else {
            p.destroy();
        }
        assertTrue(p.waitFor(30, TimeUnit.SECONDS), "child did not end after the signal");
        if (forcibly) {
            // SIGKILL runs no hook, so the temporary file may stay (documented); tidy up the folder
            for (Path t : temporaries(out)) {
                Files.deleteIfExists(t);
            }
        }
    }

    private static List<Path> temporaries(Path out) throws IOException {
        String prefix = "." + out.getFileName() + ".roseate-";
        try (Stream<Path> s = Files.list(out.getParent())) {
            return s.filter(f -> f.getFileName().toString().startsWith(prefix)).toList();
        }
    }
}
