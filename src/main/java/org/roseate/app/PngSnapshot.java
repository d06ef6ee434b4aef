package org.roseate.app;

import java.awt.image.BufferedImage;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import javafx.scene.Node;
import javafx.scene.Scene;
import javafx.scene.image.PixelReader;
import javafx.scene.image.WritableImage;
import javax.imageio.ImageIO;
import org.roseate.io.AtomicOutput;

/**
 * Writes a picture of a scene or node as PNG: JavaFX's snapshot, copied pixel by pixel into an
 * ARGB {@link BufferedImage} and encoded by {@code javax.imageio} (no javafx-swing needed).
 * Call on the FX thread.
 */
final class PngSnapshot {
    private PngSnapshot() {
    }

    static void write(Scene scene, Path file) throws IOException {
        write(scene.snapshot(null), file);
    }

    static void write(Node node, Path file) throws IOException {
        write(node.snapshot(null, null), file);
    }

    static void write(WritableImage image, Path file) throws IOException {
        int w = (int) image.getWidth();
        int h = (int) image.getHeight();
        BufferedImage b = new BufferedImage(w, h, BufferedImage.TYPE_INT_ARGB);
        PixelReader r = image.getPixelReader();
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                b.setRGB(x, y, r.getArgb(x, y));
            }
        }
        Path parent = file.toAbsolutePath().getParent();
        if (parent != null) {
            Files.createDirectories(parent);
        }
        try (AtomicOutput o = AtomicOutput.open(file, true)) {
            if (!ImageIO.write(b, "png", o.stream())) {
                throw new IOException("no PNG writer in javax.imageio");
            }
            o.commit();
        }
    }
}
