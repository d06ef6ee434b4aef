package org.roseate.circuit;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Map;
import org.roseate.value.Tolerance;

/**
 * Writes a design as design-file JSON, keys in the documented order, values in IEC 60062 letter
 * code; {@link DesignReader#parse} reads the text back to an equal design.
 */
public final class DesignWriter {
    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private DesignWriter() {
    }

    public static String toJson(Design design) {
        ObjectNode root = JSON.createObjectNode();
        root.put("name", design.name());
        root.put("description", design.description());
        if (!design.tolerances().isEmpty()) {
            ObjectNode tol = root.putObject("tolerance");
            for (Map.Entry<String, Tolerance> e : design.tolerances().entrySet()) {
                tol.put(e.getKey(), e.getValue().toString());
            }
        }
        design.source().ifPresent(src -> {
            ObjectNode o = root.putObject("source");
            o.put("densityVPerRtHz", src.densityVPerRtHz());
            o.put("flickerCornerHz", src.flickerCornerHz());
        });
        if (design.temperatureC() != Design.DEFAULT_TEMPERATURE_C) {
            root.put("temperatureC", design.temperatureC());
        }
        ArrayNode stages = root.putArray("stages");
        for (Stage s : design.stages()) {
            ObjectNode st = stages.addObject();
            st.put("kind", s.kind());
            if (s instanceof CircuitStage c) {
                st.put("input", c.input());
                st.put("output", c.output());
                ObjectNode br = st.putObject("branches");
                c.branches().forEach((key, net) -> br.put(key, net.toExpression()));
                if (!c.opamps().isEmpty()) {
                    ObjectNode ops = st.putObject("opamps");
                    c.opamps().forEach((u, op) -> {
                        ObjectNode o = ops.putObject(u);
                        o.put("plus", op.plus());
                        o.put("minus", op.minus());
                        o.put("output", op.output());
                        model(op.model(), o);
                    });
                }
                continue;
            }
            s.networks().forEach((role, net) -> st.put(role, net.toExpression()));
            s.opamp().ifPresent(op -> model(op, st.putObject("opamp")));
        }
        try {
            return JSON.writeValueAsString(root) + System.lineSeparator();
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot serialise design " + design.name(), e);
        }
    }

    /** The op-amp model keys; the ideal op-amp has none. New model keys are written here. */
    private static void model(OpAmp op, ObjectNode o) {
        if (!op.isIdeal()) {
            o.put("gbwHz", op.gbwHz());
            o.put("openLoopGain", op.openLoopGain());
        }
        OpAmp.Noise n = op.noise();
        putIf(o, "enVPerRtHz", n.enVPerRtHz(), n.enVPerRtHz() > 0);
        putIf(o, "inAPerRtHz", n.inAPerRtHz(), n.inAPerRtHz() > 0);
        putIf(o, "enCornerHz", n.enCornerHz(), n.enCornerHz() > 0);
        putIf(o, "inCornerHz", n.inCornerHz(), n.inCornerHz() > 0);
        putIf(o, "swingV", n.swingV(), n.hasSwing());
        putIf(o, "slewVPerUs", n.slewVPerUs(), n.hasSlew());
    }

    private static void putIf(ObjectNode o, String key, double value, boolean given) {
        if (given) {
            o.put(key, value);
        }
    }
}
