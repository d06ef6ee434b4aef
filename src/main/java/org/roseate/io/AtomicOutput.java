package org.roseate.io;

import java.io.BufferedOutputStream;
import java.io.Closeable;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.FileSystemException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.NotDirectoryException;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.Objects;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicLong;

/**
 * Writes a file so that no reader ever sees it half-written: bytes go to a temporary file in the
 * target's own folder, named {@code .<target name>.roseate-<pid>-<n>.tmp}, and {@link #commit()}
 * flushes, forces them to the device and renames the temporary file over the target in one
 * atomic step (falling back to a plain replacing move where the file system has no atomic
 * rename). Closing without commit deletes the temporary file, so the pattern is:
 *
 * <pre>{@code
 * try (AtomicOutput o = AtomicOutput.open(target, force)) {
 *     write(o.stream());
 *     o.commit();
 * }
 * }</pre>
 *
 * <p>Temporary files not yet committed or closed are deleted by a shutdown hook when the JVM
 * exits normally or on SIGINT/SIGTERM (Ctrl-C). After SIGKILL or a power loss no hook runs: the
 * temporary file may remain, but the target is never truncated: it holds either its old content
 * or the complete new one.
 *
 * <p>Without {@code force} an existing target is refused, both on {@link #open} and again just
 * before the rename; a file created by someone else between that last check and the rename would
 * still be replaced. Not thread-safe; one instance per writer.
 */
public final class AtomicOutput implements Closeable {
    private static final int BUFFER_BYTES = 1 << 16;
    private static final AtomicLong COUNTER = new AtomicLong();

    private final Path target;
    private final Path temp;
    private final boolean force;
    private final FileChannel channel;
    private final OutputStream stream;
    private boolean done;

    private AtomicOutput(Path target, Path temp, boolean force, FileChannel channel) {
        this.target = target;
        this.temp = temp;
        this.force = force;
        this.channel = channel;
        this.stream = new BufferedOutputStream(Channels.newOutputStream(channel), BUFFER_BYTES);
    }

    /**
     * Starts writing a file; the target is untouched until {@link #commit()}.
     *
     * @param target the file to create or replace
     * @param force  true to replace an existing target
     * @throws OutputExistsException if the target exists and force is false
     * @throws NoSuchFileException   if the target's folder does not exist
     * @throws IOException           if the target is a folder, its parent not a folder, or the
     *                               temporary file cannot be created
     */
    public static AtomicOutput open(Path target, boolean force) throws IOException {
        Objects.requireNonNull(target, "target");
        Path absolute = target.toAbsolutePath();
        Path dir = absolute.getParent();
        if (dir == null || absolute.getFileName() == null) {
            throw new FileSystemException(target.toString(), null, "not a file name");
        }
        if (!Files.exists(dir)) {
            throw new NoSuchFileException(target.toString(), null,
                    "cannot write: folder " + dir + " does not exist");
        }
        if (!Files.isDirectory(dir)) {
            throw new NotDirectoryException(dir + " is not a folder, cannot write " + target);
        }
        if (Files.isDirectory(absolute)) {
            throw new FileSystemException(target.toString(), null,
                    "is a folder, cannot write a file there");
        }
        if (!force && Files.exists(absolute)) {
            throw new OutputExistsException(target);
        }
        Pending.ensureHook();
        String prefix = "." + absolute.getFileName() + ".roseate-" + ProcessHandle.current().pid()
                + "-";
        for (int attempt = 0; ; attempt++) {
            Path temp = dir.resolve(prefix + COUNTER.incrementAndGet() + ".tmp");
            try {
                FileChannel ch = FileChannel.open(temp, StandardOpenOption.CREATE_NEW,
                        StandardOpenOption.WRITE);
                Pending.FILES.add(temp);
                return new AtomicOutput(target, temp, force, ch);
            } catch (FileAlreadyExistsException e) {
                if (attempt >= 100) {
                    throw e;
                }
            } catch (AccessDeniedException e) {
                throw new AccessDeniedException(target.toString(), null,
                        "cannot create a file in folder " + dir + " (permission denied)");
            }
        }
    }

    /** The buffered stream to write the content to; do not close it, call commit() or close(). */
    public OutputStream stream() {
        return stream;
    }

    /** The file that commit() creates or replaces. */
    public Path target() {
        return target;
    }

    /** The temporary file being written (for diagnostics and tests). */
    public Path tempFile() {
        return temp;
    }

    /**
     * Flushes, forces the content to the device and moves the temporary file onto the target.
     *
     * @throws OutputExistsException if force is false and the target appeared since open
     * @throws IllegalStateException if already committed or closed
     */
    public void commit() throws IOException {
        if (done) {
            throw new IllegalStateException("AtomicOutput for " + target + " already finished");
        }
        done = true;
        try {
            stream.flush();
            channel.force(true);
            channel.close();
            if (!force && Files.exists(target)) {
                throw new OutputExistsException(target);
            }
            try {
                Files.move(temp, target, StandardCopyOption.ATOMIC_MOVE,
                        StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(temp, target, StandardCopyOption.REPLACE_EXISTING);
            }
            Pending.FILES.remove(temp);
            forceFolder(target.toAbsolutePath().getParent());
        } catch (IOException | RuntimeException e) {
            discard();
            throw e;
        }
    }

    /** Makes the rename itself durable where the platform allows syncing a folder (Linux, macOS). */
    private static void forceFolder(Path dir) {
        try (FileChannel d = FileChannel.open(dir, StandardOpenOption.READ)) {
            d.force(true);
        } catch (IOException | UnsupportedOperationException e) {
            // Not possible on every platform (Windows); the content itself is already forced.
        }
    }

    /** Without a prior commit, deletes the temporary file and leaves the target untouched. */
    @Override
    public void close() throws IOException {
        if (!done) {
            done = true;
            discard();
        }
    }

    private void discard() throws IOException {
        try {
            channel.close();
        } finally {
            Files.deleteIfExists(temp);
            Pending.FILES.remove(temp);
        }
    }

    /**
     * Atomically writes a string as UTF-8.
     *
     * @throws OutputExistsException if the target exists and force is false
     */
    public static void writeString(Path target, String content, boolean force) throws IOException {
        try (AtomicOutput o = open(target, force)) {
            o.stream().write(content.getBytes(StandardCharsets.UTF_8));
            o.commit();
        }
    }

    /** Temporary files to remove if the JVM shuts down before they are committed or closed. */
    private static final class Pending {
        static final Set<Path> FILES = ConcurrentHashMap.newKeySet();
        private static volatile boolean hooked;

        static void ensureHook() {
            if (hooked) {
                return;
            }
            synchronized (Pending.class) {
                if (!hooked) {
                    Runtime.getRuntime().addShutdownHook(
                            new Thread(Pending::deleteAll, "roseate-temp-cleanup"));
                    hooked = true;
                }
            }
        }

        private static void deleteAll() {
            for (Path p : FILES) {
                try {
                    Files.deleteIfExists(p);
                } catch (IOException e) {
                    // Shutting down: nothing useful left to do with the error.
                }
            }
        }
    }
}
