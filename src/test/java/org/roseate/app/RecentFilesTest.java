package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The recent-files list: order, no duplicates, the cap, persistence and a damaged store. */
class RecentFilesTest {
    @TempDir
    Path dir;

    @Test
    void newestFirstOnceEachCappedAndKept() throws Exception {
        Path store = dir.resolve("cfg").resolve(RecentFiles.FILE_NAME);
        RecentFiles r = new RecentFiles(store);
        assertEquals(List.of(), r.list(), "no store yet: an empty list");
        for (int i = 0; i < RecentFiles.MAX + 3; i++) {
            assertTrue(r.add(dir.resolve("d" + i + ".json")));
        }
        assertTrue(r.add(dir.resolve("d5.json")));
        List<Path> l = new RecentFiles(store).list();
        assertEquals(RecentFiles.MAX, l.size());
        assertEquals(dir.resolve("d5.json").toAbsolutePath(), l.get(0));
        assertEquals(dir.resolve("d12.json").toAbsolutePath(), l.get(1));
        assertEquals(1, l.stream().filter(p -> p.getFileName().toString().equals("d5.json")).count());
        assertEquals(dir.resolve("d3.json").toAbsolutePath(), l.get(RecentFiles.MAX - 1), "d0 to d2, the oldest, fell off");
        assertTrue(r.clear());
        assertEquals(List.of(), new RecentFiles(store).list());
    }

    @Test
    void aStoreThatIsAFolderReadsAsEmpty() throws Exception {
        Path store = dir.resolve("folder");
        Files.createDirectories(store);
        assertEquals(List.of(), new RecentFiles(store).list());
    }
}
