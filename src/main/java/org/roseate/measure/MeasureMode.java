package org.roseate.measure;

/** What a measurement reads. */
public enum MeasureMode {
    /** Band levels of a noise source, one channel. */
    NOISE_SOURCE("Noise source"),
    /** H1 transfer function and coherence from a reference and a response channel. */
    TRANSFER("Transfer (H1, two channels)");

    private final String label;

    MeasureMode(String label) {
        this.label = label;
    }

    /** A short description for menus. */
    @Override
    public String toString() {
        return label;
    }
}
