package org.roseate.app;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.roseate.io.AtomicOutput;

/**
 * The recently opened design files, newest first, at most {@value #MAX} of them, kept in the user's
 * configuration folder as one absolute path per line ({@value #FILE_NAME}). The folder: the
 * {@code roseate.configDir} system property if set; else {@code $XDG_CONFIG_HOME/roseate}; else
 * {@code %APPDATA%\Roseate} on Windows; else {@code ~/.config/roseate}. A missing or unreadable
 * list is an empty one; a failed write leaves the old list whole (atomic replace).
 */
final class RecentFiles {
    static final int MAX = 10;
    static final String FILE_NAME = "recent-files.txt";
    private final Path store;
    private final List<Path> files = new ArrayList<>();

    RecentFiles(Path store) {
        this.store = store;
        load();
    }

    /** The list in the user's configuration folder. */
    static RecentFiles forUser() {
        return new RecentFiles(configDir().resolve(FILE_NAME));
    }

    static Path configDir() {
        String prop = System.getProperty("roseate.configDir");
        if (prop != null && !prop.isBlank()) {
            return Path.of(prop);
        }
        String xdg = System.getenv("XDG_CONFIG_HOME");
        if (xdg != null && !xdg.isBlank()) {
            return Path.of(xdg, "roseate");
        }
        String appData = System.getenv("APPDATA");
        if (appData != null && !appData.isBlank() && System.getProperty("os.name", "").startsWith("Windows")) {
            return Path.of(appData, "Roseate");
        }
        return Path.of(System.getProperty("user.home"), ".config", "roseate");
    }

    private void load() {
        files.clear();
        try {
            if (Files.isRegularFile(store)) {
                for (String line : Files.readAllLines(store, StandardCharsets.UTF_8)) {
                    if (!line.isBlank() && files.size() < MAX) {
                        Path p = Path.of(line.strip());
                        if (!files.contains(p)) {
                            files.add(p);
                        }
                    }
                }
            }
        } catch (IOException | RuntimeException e) {
            files.clear();
        }
    }

    /** Newest first. */
    List<Path> list() {
        return List.copyOf(files);
    }

    /** Puts {@code file} first (once) and saves the list; a failed save is reported by the return value. */
    boolean add(Path file) {
        Path p = file.toAbsolutePath().normalize();
        files.remove(p);
        files.add(0, p);
        while (files.size() > MAX) {
            files.remove(files.size() - 1);
        }
        return save();
    }

    boolean clear() {
        files.clear();
        return save();
    }

    private boolean save() {
        StringBuilder sb = new StringBuilder();
        files.forEach(f -> sb.append(f).append('\n'));
        try {
            Path parent = store.toAbsolutePath().getParent();
            if (parent != null) {
                Files.createDirectories(parent);
            }
            AtomicOutput.writeString(store, sb.toString(), true);
            return true;
        } catch (IOException e) {
            return false;
        }
    }

    Path store() {
        return store;
    }
}
