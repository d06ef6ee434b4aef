package org.roseate.app;

import org.junit.jupiter.api.extension.BeforeAllCallback;
import org.junit.jupiter.api.extension.ExtensionContext;

/**
 * Puts TestFX on the Monocle headless platform when there is no display, before the JavaFX
 * toolkit starts; with a DISPLAY the tests run on the real window system. Register it before
 * TestFX's ApplicationExtension.
 */
public final class HeadlessFx implements BeforeAllCallback {
    @Override
    public void beforeAll(ExtensionContext context) {
        activate();
    }

    /** Sets the Monocle properties once, if no display is present. */
    static synchronized void activate() {
        // Building the window takes a few seconds on a loaded CI machine (2 cores shared with other
        // builds); TestFX's own default wait for the start method is shorter than that can take.
        // The window keeps its recent-files list in the user's configuration folder; tests keep theirs
        // under target/ so no test run writes into the developer's home.
        if (System.getProperty("roseate.configDir") == null) {
            System.setProperty("roseate.configDir", "target/test-config");
        }
        if (System.getProperty("testfx.setup.timeout") == null) {
            System.setProperty("testfx.setup.timeout", "120000");
        }
        if (System.getenv("DISPLAY") != null && !Boolean.getBoolean("roseate.headless")) {
            return;
        }
        System.setProperty("testfx.robot", "glass");
        System.setProperty("testfx.headless", "true");
        System.setProperty("glass.platform", "Monocle");
        System.setProperty("monocle.platform", "Headless");
        System.setProperty("prism.order", "sw");
        System.setProperty("prism.text", "t2k");
        System.setProperty("java.awt.headless", "true");
    }
}
