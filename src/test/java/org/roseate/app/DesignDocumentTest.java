package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class DesignDocumentTest {
    @TempDir
    Path dir;

    @Test
    void undoAndRedoWalkTheCommittedEdits() {
        DesignDocument d = new DesignDocument("a", null);
        assertFalse(d.undo());
        d.edit("b");
        d.edit("c");
        assertFalse(d.edit("c"), "an unchanged text is not an edit");
        assertTrue(d.undo());
        assertEquals("b", d.text());
        assertTrue(d.undo());
        assertEquals("a", d.text());
        assertFalse(d.dirty());
        assertTrue(d.redo());
        assertEquals("b", d.text());
        d.edit("x");
        assertFalse(d.redo(), "a new edit clears redo");
    }

    @Test
    void saveIsAtomicAndRemovesTheAutosave() throws Exception {
        Path f = dir.resolve("d.json");
        Files.writeString(f, "old");
        DesignDocument d = new DesignDocument("", null);
        d.load(f, "old");
        d.edit("new text");
        assertTrue(d.writeAutosave());
        Path a = DesignDocument.autosaveOf(f);
        assertEquals(".d.json.roseate-autosave", a.getFileName().toString());
        assertEquals("new text", Files.readString(a));
        d.saveAs(f);
        assertEquals("new text", Files.readString(f));
        assertFalse(Files.exists(a));
        assertFalse(d.dirty());
        try (Stream<Path> s = Files.list(dir)) {
            assertEquals(List.of(f), s.toList(), "no temporary file is left behind");
        }
    }

    @Test
    void anAutosaveIsOfferedOnlyWhenNewerAndDifferent() throws Exception {
        Path f = dir.resolve("d.json");
        Files.writeString(f, "file");
        Path a = DesignDocument.autosaveOf(f);
        Files.writeString(a, "edited");
        Files.setLastModifiedTime(f, FileTime.fromMillis(1_000_000));
        Files.setLastModifiedTime(a, FileTime.fromMillis(2_000_000));
        assertEquals("edited", DesignDocument.pendingAutosave(f).orElseThrow());
        Files.setLastModifiedTime(a, FileTime.fromMillis(500_000));
        assertTrue(DesignDocument.pendingAutosave(f).isEmpty(), "older than the file");
        Files.writeString(a, "file");
        Files.setLastModifiedTime(a, FileTime.fromMillis(2_000_000));
        assertTrue(DesignDocument.pendingAutosave(f).isEmpty(), "same as the file");
    }
}
