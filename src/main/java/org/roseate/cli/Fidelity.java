package org.roseate.cli;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.roseate.digital.FidelityReport;

/**
 * Prints a digital-versus-analog fidelity report. A band the output stream cannot hold whole (the
 * 20 kHz third-octave band, 17.8–22.4 kHz, at 44.1 kHz) is judged on the part the decimator passes,
 * and the table says where it was cut and why.
 */
final class Fidelity {
    private Fidelity() {
    }

    static String table(FidelityReport r, double toleranceDb) {
        StringBuilder sb = new StringBuilder();
        sb.append(Numbers.f("Digital model at %.0f Hz: %dx oversampled; worst third-octave band %+.3f dB from the analog model (target ±%.2f dB)%s%n",
                r.outputRateHz(), r.factor(), r.worstBand().differenceDb(), toleranceDb,
                r.maxAbsDifferenceDb() <= toleranceDb ? "" : " — NOT MET"));
        sb.append(Numbers.f("%11s %11s %13s %18s%n", "band low Hz", "high Hz", "judged to Hz", "digital−analog dB"));
        for (FidelityReport.Band b : r.bands()) {
            sb.append(Numbers.f("%11.2f %11.2f %13.2f %18.4f%s%n", b.lowHz(), b.highHz(), b.comparedHighHz(), b.differenceDb(),
                    cut(b) ? " *" : ""));
        }
        for (FidelityReport.Band b : r.bands()) {
            if (cut(b)) {
                sb.append(note(r, b)).append(System.lineSeparator());
            }
        }
        return sb.toString();
    }

    private static boolean cut(FidelityReport.Band b) {
        // Relative slack: the passband edge and the band table compute the same edge by different routes.
        return b.comparedHighHz() < b.highHz() * (1 - 1e-9);
    }

    /** Why a band was judged on part of its width only. */
    static String note(FidelityReport r, FidelityReport.Band b) {
        double nyquist = r.outputRateHz() / 2;
        if (b.highHz() > nyquist) {
            return Numbers.f("* %.0f–%.0f Hz: above %.0f Hz (half of %.0f Hz) this band cannot exist in the file; "
                    + "%.0f–%.0f Hz is the decimator's transition band; judged on the part it passes, %.0f–%.0f Hz",
                    b.lowHz(), b.highHz(), nyquist, r.outputRateHz(), b.comparedHighHz(), nyquist, b.lowHz(), b.comparedHighHz());
        }
        return Numbers.f("* %.0f–%.0f Hz: judged up to the decimator's passband edge, %.0f Hz",
                b.lowHz(), b.highHz(), b.comparedHighHz());
    }

    /** One object per band into {@code bands}: its edges, the part judged, the difference and the verdict. */
    static void json(FidelityReport r, double toleranceDb, ArrayNode bands) {
        for (FidelityReport.Band b : r.bands()) {
            ObjectNode o = bands.addObject();
            o.put("lowHz", b.lowHz());
            o.put("highHz", b.highHz());
            o.put("judgedHighHz", b.comparedHighHz());
            o.put("differenceDb", b.differenceDb());
            o.put("withinTolerance", Math.abs(b.differenceDb()) <= toleranceDb);
            if (cut(b)) {
                o.put("note", note(r, b).substring(2));
            }
        }
    }
}
