package org.roseate.spectrum;

/**
 * The unit of a spectral density and of the band levels made from it.
 */
public enum DensityUnit {
    /** Full scale squared per hertz; band levels in dBFS, where a full-scale sine reads 0 dBFS (AES17). */
    FULL_SCALE_SQUARED_PER_HZ("FS²/Hz", "dBFS"),
    /** Volts squared per hertz (after a volts-per-full-scale calibration); band levels in dBV (re 1 V rms). */
    VOLTS_SQUARED_PER_HZ("V²/Hz", "dBV");

    private final String symbol;
    private final String levelSymbol;

    DensityUnit(String symbol, String levelSymbol) {
        this.symbol = symbol;
        this.levelSymbol = levelSymbol;
    }

    /** "FS²/Hz" or "V²/Hz". */
    public String symbol() {
        return symbol;
    }

    /** "dBFS" or "dBV". */
    public String levelSymbol() {
        return levelSymbol;
    }

    /**
     * The level in dB of a band power in this unit's squared quantity: dBFS = 10·log10(2·P)
     * since a full-scale sine has mean square 1/2 (AES17 convention), dBV = 10·log10(P / 1 V²).
     */
    public double levelDb(double power) {
        return this == FULL_SCALE_SQUARED_PER_HZ ? 10 * Math.log10(2 * power) : 10 * Math.log10(power);
    }
}
