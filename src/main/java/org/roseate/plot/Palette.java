package org.roseate.plot;

import java.awt.Color;

/** Roseate's chart colours: muted, distinguishable, readable on white. */
public final class Palette {
    private static final Color[] SERIES = {
        new Color(0x2F5D7C), // slate blue
        new Color(0xC0605A), // dusty rose
        new Color(0x5E8C61), // sage
        new Color(0xB08A3E), // ochre
        new Color(0x7A5C8E), // heather
        new Color(0x4A8C8C), // teal grey
    };
    /** The target line. */
    public static final Color TARGET = new Color(0x8A8A8A);
    /** Grid lines. */
    public static final Color GRID = new Color(0xE2E2E2);
    /** Plot background. */
    public static final Color BACKGROUND = Color.WHITE;

    private Palette() {
    }

    /** The i-th series colour (cycling), i ≥ 0. */
    public static Color series(int i) {
        return SERIES[Math.floorMod(i, SERIES.length)];
    }

    /** The same colour with alpha 0…255, for fills. */
    public static Color translucent(Color c, int alpha) {
        return new Color(c.getRed(), c.getGreen(), c.getBlue(), alpha);
    }
}
