package org.roseate.digital;

import java.util.List;

/**
 * How closely a digital path follows its analog model, band by band.
 *
 * @param factor       oversampling factor the path runs at
 * @param outputRateHz output rate in Hz
 * @param bands        per-band results, in the order the bands were given
 */
public record FidelityReport(int factor, double outputRateHz, List<Band> bands) {
    /**
     * One band.
     *
     * @param lowHz          lower band edge as given, Hz
     * @param highHz         upper band edge as given, Hz
     * @param comparedHighHz upper edge actually integrated: min(highHz, audio passband edge), Hz
     * @param differenceDb   digital band level minus analog band level, dB
     */
    public record Band(double lowHz, double highHz, double comparedHighHz, double differenceDb) {
    }

    public FidelityReport {
        bands = List.copyOf(bands);
    }

    /** max |differenceDb| over the bands, dB (0 for no bands). */
    public double maxAbsDifferenceDb() {
        double m = 0;
        for (Band b : bands) {
            m = Math.max(m, Math.abs(b.differenceDb()));
        }
        return m;
    }

    /** The band with the largest |differenceDb|. */
    public Band worstBand() {
        Band worst = bands.get(0);
        for (Band b : bands) {
            if (Math.abs(b.differenceDb()) > Math.abs(worst.differenceDb())) {
                worst = b;
            }
        }
        return worst;
    }
}
