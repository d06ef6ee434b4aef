package org.roseate.measure;

/** How noise-source band levels are read. */
public enum BandReader {
    /**
     * The Welch density integrated between the IEC 61260-1 band edges
     * ({@link org.roseate.spectrum.BandLevels}).
     */
    WELCH("welch", "FFT (Welch)"),
    /**
     * The time-domain filter bank ({@link org.roseate.spectrum.FilterBank}): one Butterworth band-pass
     * per band and a mean square; reads noise high by the filters' noise bandwidth (see there).
     */
    FILTER_BANK("filter-bank", "Filter bank (time domain)");

    private final String key;
    private final String label;

    BandReader(String key, String label) {
        this.key = key;
        this.label = label;
    }

    /** The name in JSON output: "welch" or "filter-bank". */
    public String key() {
        return key;
    }

    @Override
    public String toString() {
        return label;
    }
}
