package org.roseate.cli;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.roseate.digital.FidelityReport;

/** Prints a digital-versus-analog fidelity report. */
final class Fidelity {
    private Fidelity() {
    }

    static String table(FidelityReport r, double toleranceDb) {
        StringBuilder sb = new StringBuilder();
        sb.append(Numbers.f("Digital model at %.0f Hz: %dx oversampled; worst third-octave band %+.3f dB from the analog model (target ±%.2f dB)%s%n",
                r.outputRateHz(), r.factor(), r.worstBand().differenceDb(), toleranceDb,
                r.maxAbsDifferenceDb() <= toleranceDb ? "" : " — NOT MET: the top band is bent by the bilinear map"));
        sb.append(Numbers.f("%11s %11s %12s%n", "low Hz", "high Hz", "digital−analog dB"));
        for (FidelityReport.Band b : r.bands()) {
            sb.append(Numbers.f("%11.2f %11.2f %12.4f%n", b.lowHz(), b.comparedHighHz(), b.differenceDb()));
        }
        return sb.toString();
    }

    /** One object per band into {@code bands}: its edges, the part compared, the difference and the verdict. */
    static void json(FidelityReport r, double toleranceDb, ArrayNode bands) {
        for (FidelityReport.Band b : r.bands()) {
            ObjectNode o = bands.addObject();
            o.put("lowHz", b.lowHz());
            o.put("highHz", b.highHz());
            o.put("comparedHighHz", b.comparedHighHz());
            o.put("differenceDb", b.differenceDb());
            o.put("withinTolerance", Math.abs(b.differenceDb()) <= toleranceDb);
        }
    }
}
