package org.roseate.measure;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.roseate.bands.BandFraction;

/**
 * The JSON form of a result, indented, one object. Keys are contracts (README): values that do not
 * exist are null, never NaN.
 */
public final class MeasureJson {
    private MeasureJson() {
    }

    /** The JSON text, ending with a newline. */
    public static String of(MeasureResult r) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        try {
            return m.writeValueAsString(tree(r, m)) + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /** The JSON tree (for callers that embed it). */
    public static ObjectNode tree(MeasureResult r, ObjectMapper m) {
        MeasureRequest q = r.request();
        boolean transfer = r.mode() == MeasureMode.TRANSFER;
        ObjectNode root = m.createObjectNode();
        root.put("file", MeasureTable.displayName(r.source()));
        root.put("mode", transfer ? "transfer" : "noise");
        root.put("sampleRateHz", r.sampleRateHz());
        if (transfer) {
            root.put("referenceChannel", q.referenceChannel() + 1);
            root.put("responseChannel", q.responseChannel() + 1);
        } else {
            root.put("channel", q.responseChannel() + 1);
            root.put("bandReader", q.reader().key());
        }
        root.put("calibrated", q.calibration() != null);
        put(root, "calibrationCornerHz", r.calibrationCornerHz());
        root.put("segmentLength", r.segmentLength());
        root.put("resolutionHz", r.resolutionHz());
        root.put("averages", r.averages());
        put(root, "effectiveSeconds", r.effectiveSeconds());
        root.put("seconds", r.secondsAnalysed());
        root.put("unit", r.levelUnit());
        root.put("bandFraction", q.table().fraction() == BandFraction.OCTAVE ? "octave" : "third");
        if (transfer) {
            root.put("coherenceThreshold", q.coherenceThreshold());
        }
        put(root, "targetSlopeDbPerOctave", q.target() == null ? Double.NaN : q.target().dbPerOctave());
        root.put("referenceBandHz", r.referenceBand().nominalHz());
        put(root, "slopeDbPerOctave", r.slopeDbPerOctave().value());
        put(root, "slopeUncertaintyDbPerOctave", r.slopeDbPerOctave().uncertainty());
        put(root, "maxBandDeviationDb", r.maxBandDeviationDb().value());
        put(root, "maxBandDeviationUncertaintyDb", r.maxBandDeviationDb().uncertainty());
        if (r.hasDesign()) {
            put(root, "designOffsetDb", r.designOffsetDb());
        }
        root.put("countedBands", r.countedBands());
        root.put("clippedSamples", r.clippedSamples());
        ChannelIntegrity measured = r.measuredChannel();
        root.put("dcOffsetFs", measured.dcOffsetFs());
        put(root, "rmsDbfs", measured.rmsDbfs());
        ArrayNode ch = root.putArray("channels");
        for (ChannelIntegrity c : r.integrity()) {
            ObjectNode o = ch.addObject();
            o.put("channel", c.channel() + 1);
            o.put("frames", c.frames());
            o.put("dcOffsetFs", c.dcOffsetFs());
            put(o, "rmsDbfs", c.rmsDbfs());
            o.put("peakFs", c.peakFs());
            o.put("clippedSamples", c.clippedSamples());
        }
        ArrayNode warnings = root.putArray("warnings");
        r.warnings().forEach(warnings::add);
        ArrayNode bands = root.putArray("bands");
        for (BandResult b : r.bands()) {
            ObjectNode o = bands.addObject();
            o.put("nominalHz", b.band().nominalHz());
            o.put("lowHz", b.band().lowHz());
            o.put("highHz", b.band().highHz());
            put(o, "db", b.levelDb());
            put(o, "uncertaintyDb", b.uncertaintyDb());
            put(o, "deviationDb", b.deviationDb());
            put(o, "normalizedDb", b.normalizedDb());
            if (r.hasDesign()) {
                put(o, "designDifferenceDb", b.designDifferenceDb());
            }
            if (transfer) {
                put(o, "coherence", b.coherence());
                o.put("trusted", b.trusted());
            }
            o.put("tone", b.toneDominated());
            o.put("complete", b.complete());
            o.put("counted", b.counted());
            o.put("belowCalibrationCorner", b.belowCalibrationCorner());
        }
        if (transfer) {
            ArrayNode arr = root.putArray("response");
            for (ResponsePoint p : r.points()) {
                ObjectNode o = arr.addObject();
                o.put("hz", p.hz());
                put(o, "db", p.db());
                put(o, "uncertaintyDb", p.uncertaintyDb());
                put(o, "deg", p.deg());
                put(o, "uncertaintyDeg", p.uncertaintyDeg());
                put(o, "coherence", p.coherence());
                o.put("trusted", p.trusted());
                put(o, "targetDb", p.targetDb());
                put(o, "modelDb", p.modelDb());
            }
        }
        root.put("legend", r.legend());
        return root;
    }

    private static void put(ObjectNode o, String key, double v) {
        if (Double.isFinite(v)) {
            o.put(key, v);
        } else {
            o.putNull(key);
        }
    }
}
