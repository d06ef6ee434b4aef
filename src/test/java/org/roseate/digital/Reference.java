package org.roseate.digital;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import org.roseate.model.Complex;

/** Reads the scipy reference files written by src/test/python/gen_digital_reference.py. */
final class Reference {
    private Reference() {
    }

    static JsonNode load(String file) {
        String path = "/reference/digital/" + file;
        try (InputStream in = Reference.class.getResourceAsStream(path)) {
            if (in == null) {
                throw new IllegalStateException("missing test resource " + path);
            }
            return new ObjectMapper().readTree(in);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static List<Complex> complexList(JsonNode array) {
        List<Complex> out = new ArrayList<>();
        for (JsonNode c : array) {
            out.add(new Complex(c.get(0).asDouble(), c.get(1).asDouble()));
        }
        return out;
    }

    static double[] doubles(JsonNode array) {
        double[] out = new double[array.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = array.get(i).asDouble();
        }
        return out;
    }

    /** Sections from scipy sos rows [b0, b1, b2, a0, a1, a2]; a0 must be 1. */
    static SosDesign sos(JsonNode rows, double sampleRateHz) {
        List<Biquad> sections = new ArrayList<>();
        for (JsonNode r : rows) {
            if (r.get(3).asDouble() != 1.0) {
                throw new IllegalStateException("a0 != 1 in reference row " + r);
            }
            sections.add(new Biquad(r.get(0).asDouble(), r.get(1).asDouble(), r.get(2).asDouble(),
                    r.get(4).asDouble(), r.get(5).asDouble()));
        }
        return new SosDesign(sections, sampleRateHz);
    }

    static List<JsonNode> cases(String file) {
        List<JsonNode> out = new ArrayList<>();
        load(file).get("cases").forEach(out::add);
        return out;
    }
}
