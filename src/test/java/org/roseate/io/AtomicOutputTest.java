package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.File;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The atomic-replacement contract: the target holds its old content or the complete new one,
 * never a prefix. Checked against the file system itself and, for crashes, against a child JVM
 * killed mid-write (SIGKILL: no hook runs; SIGTERM: the shutdown hook removes the temp file, as
 * java.lang.Runtime#addShutdownHook documents for termination signals).
 */
class AtomicOutputTest {
    @TempDir
    Path dir;

    private List<Path> listing() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.sorted().toList();
        }
    }

    @Test
    void commitMovesTheCompleteFileIntoPlace() throws IOException {
        Path target = dir.resolve("out.wav");
        try (AtomicOutput o = AtomicOutput.open(target, false)) {
            o.stream().write("hello".getBytes(StandardCharsets.US_ASCII));
            Path temp = o.tempFile();
            assertEquals(dir, temp.getParent(), "temp lives in the target's folder");
            assertTrue(temp.getFileName().toString().matches("\\.out\\.wav\\.roseate-\\d+-\\d+\\.tmp"),
                    temp.toString());
            assertFalse(Files.exists(target), "nothing at the target before commit");
            o.commit();
        }
        assertEquals("hello", Files.readString(target));
        assertEquals(List.of(target), listing(), "no temp left behind");
    }

    @Test
    void closeWithoutCommitLeavesNeitherTargetNorTemp() throws IOException {
        Path target = dir.resolve("out.wav");
        try (AtomicOutput o = AtomicOutput.open(target, false)) {
            o.stream().write(new byte[100_000]);
            o.stream().flush();
            assertTrue(Files.exists(o.tempFile()));
        }
        assertEquals(List.of(), listing());
    }

    @Test
    void existingTargetWithoutForceIsRefusedAndUntouched() throws IOException {
        Path target = dir.resolve("out.wav");
        Files.writeString(target, "old");
        OutputExistsException e = assertThrows(OutputExistsException.class,
                () -> AtomicOutput.open(target, false));
        assertEquals(target + " already exists; add --force to replace it", e.getMessage());
        assertThrows(OutputExistsException.class,
                () -> AtomicOutput.writeString(target, "new", false));
        assertEquals("old", Files.readString(target));
        assertEquals(List.of(target), listing());
    }

    @Test
    void targetAppearingBeforeCommitWithoutForceIsRefused() throws IOException {
        Path target = dir.resolve("out.wav");
        try (AtomicOutput o = AtomicOutput.open(target, false)) {
            o.stream().write(1);
            Files.writeString(target, "theirs");
            assertThrows(OutputExistsException.class, o::commit);
        }
        assertEquals("theirs", Files.readString(target));
        assertEquals(List.of(target), listing());
    }

    @Test
    void forceReplaces() throws IOException {
        Path target = dir.resolve("table.csv");
        Files.writeString(target, "old content that is longer");
        AtomicOutput.writeString(target, "new", true);
        assertEquals("new", Files.readString(target));
        assertEquals(List.of(target), listing());
    }

    @Test
    void missingFolderAndFolderTargetGiveClearMessages() throws IOException {
        Path target = dir.resolve("nope").resolve("out.wav");
        NoSuchFileException e = assertThrows(NoSuchFileException.class,
                () -> AtomicOutput.open(target, true));
        assertEquals(target + ": cannot write: folder " + dir.resolve("nope") + " does not exist",
                e.getMessage());
        Files.createDirectory(dir.resolve("sub"));
        IOException f = assertThrows(IOException.class,
                () -> AtomicOutput.open(dir.resolve("sub"), true));
        assertEquals(dir.resolve("sub") + ": is a folder, cannot write a file there",
                f.getMessage());
    }

    @Test
    void commitTwiceIsAnError() throws IOException {
        try (AtomicOutput o = AtomicOutput.open(dir.resolve("a"), false)) {
            o.commit();
            assertThrows(IllegalStateException.class, o::commit);
        }
        assertTrue(Files.exists(dir.resolve("a")));
    }

    /** Starts SlowWriterMain on target and waits until it is writing; returns its temp file. */
    private static Process startWriter(Path target, Path[] tempOut) throws IOException {
        String java = System.getProperty("java.home") + File.separator + "bin" + File.separator
                + "java";
        Process p = new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"),
                SlowWriterMain.class.getName(), target.toString())
                .redirectError(ProcessBuilder.Redirect.INHERIT).start();
        BufferedReader r = new BufferedReader(
                new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8));
        String line = r.readLine();
        assertTrue(line != null && line.startsWith("WRITING "), "child said: " + line);
        tempOut[0] = Path.of(line.substring("WRITING ".length()));
        return p;
    }

    @Test
    void killedWriterNeverTruncatesTheTarget() throws IOException, InterruptedException {
        Path target = dir.resolve("out.wav");
        Files.writeString(target, "old");
        Path[] temp = new Path[1];
        Process p = startWriter(target, temp);
        assertTrue(Files.size(temp[0]) >= 1 << 16, "child really wrote");
        p.destroyForcibly();
        assertTrue(p.waitFor(30, TimeUnit.SECONDS));
        assertEquals("old", Files.readString(target), "target intact after SIGKILL");
        // after SIGKILL no hook ran: the temp file may remain; the target is what matters
        Files.deleteIfExists(temp[0]);
    }

    @Test
    void terminatedWriterLeavesNoTargetAndNoTemp() throws IOException, InterruptedException {
        Assumptions.assumeFalse(System.getProperty("os.name").startsWith("Windows"),
                "destroy() is forcible on Windows: no shutdown hook runs there");
        Path target = dir.resolve("out.wav");
        Path[] temp = new Path[1];
        Process p = startWriter(target, temp);
        p.destroy();
        assertTrue(p.waitFor(30, TimeUnit.SECONDS));
        assertFalse(Files.exists(target), "no target after SIGTERM mid-write");
        assertFalse(Files.exists(temp[0]), "the shutdown hook removed the temp file");
        assertEquals(List.of(), listing());
    }
}
