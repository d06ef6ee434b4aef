package org.roseate.app;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalTime;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import org.roseate.bands.Band;
import org.roseate.io.AtomicOutput;

/**
 * The bench's kept readings on disk, as JSON:
 * <pre>
 * { "keptReadings": 1,
 *   "readings": [ { "name": …, "time": "HH:MM:SS", "settings": …, "bands": ["20", "25", …],
 *                   "levelsDb": […], "minusDesignDb": […], "minusTargetDb": […] } ] }
 * </pre>
 * Bands are their nominal labels; a value that does not exist (no design, an uncounted band) is
 * {@code null}. Written atomically; read back only onto the same bands.
 */
final class KeptReadingsFile {
    static final int VERSION = 1;
    private static final ObjectMapper JSON = new ObjectMapper();

    private KeptReadingsFile() {
    }

    /** One reading as stored: everything of a {@link BenchView.KeptTrace} except its colour. */
    record Stored(String name, LocalTime time, String settings, List<String> bandLabels, double[] levelsDb,
            double[] minusDesignDb, double[] minusTargetDb) {
    }

    static void write(Path file, List<BenchView.KeptTrace> traces) throws IOException {
        ObjectNode root = JSON.createObjectNode();
        root.put("keptReadings", VERSION);
        ArrayNode list = root.putArray("readings");
        for (BenchView.KeptTrace t : traces) {
            ObjectNode o = list.addObject();
            o.put("name", t.name());
            o.put("time", t.time().toString());
            o.put("settings", t.settings());
            ArrayNode bands = o.putArray("bands");
            t.bands().forEach(b -> bands.add(b.label()));
            numbers(o.putArray("levelsDb"), t.levelsDb());
            numbers(o.putArray("minusDesignDb"), t.minusDesignDb());
            numbers(o.putArray("minusTargetDb"), t.minusTargetDb());
        }
        AtomicOutput.writeString(file, JSON.writerWithDefaultPrettyPrinter().writeValueAsString(root) + "\n", true);
    }

    private static void numbers(ArrayNode a, double[] values) {
        for (double v : values) {
            if (Double.isFinite(v)) {
                a.add(v);
            } else {
                a.addNull();
            }
        }
    }

    /**
     * Reads the readings of a file.
     *
     * @throws IOException with a one-line message naming the file when it cannot be read or is not
     *                     a kept-readings file
     */
    static List<Stored> read(Path file) throws IOException {
        JsonNode root;
        try {
            root = JSON.readTree(Files.readString(file));
        } catch (JsonProcessingException e) {
            throw new IOException(file + ": not JSON (" + e.getOriginalMessage() + ")");
        }
        if (root == null || !root.path("keptReadings").isInt() || root.path("keptReadings").asInt() != VERSION
                || !root.path("readings").isArray()) {
            throw new IOException(file + ": not a kept-readings file (\"keptReadings\": " + VERSION + " and \"readings\" expected)");
        }
        List<Stored> out = new ArrayList<>();
        int index = 0;
        for (JsonNode o : root.get("readings")) {
            String where = file + ": reading " + (++index);
            List<String> labels = new ArrayList<>();
            for (JsonNode b : o.path("bands")) {
                labels.add(b.asText());
            }
            double[] lv = numbers(o.path("levelsDb"), labels.size(), where + " levelsDb");
            double[] dd = numbers(o.path("minusDesignDb"), labels.size(), where + " minusDesignDb");
            double[] dt = numbers(o.path("minusTargetDb"), labels.size(), where + " minusTargetDb");
            LocalTime time;
            try {
                time = LocalTime.parse(o.path("time").asText());
            } catch (DateTimeParseException e) {
                throw new IOException(where + ": time \"" + o.path("time").asText() + "\" is not HH:MM:SS");
            }
            if (!o.path("name").isTextual() || labels.isEmpty()) {
                throw new IOException(where + ": a name and at least one band are required");
            }
            out.add(new Stored(o.get("name").asText(), time, o.path("settings").asText(""), labels, lv, dd, dt));
        }
        return out;
    }

    private static double[] numbers(JsonNode a, int n, String where) throws IOException {
        if (!a.isArray() || a.size() != n) {
            throw new IOException(where + ": " + n + " values expected, one per band");
        }
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            JsonNode x = a.get(i);
            if (x.isNull()) {
                v[i] = Double.NaN;
            } else if (x.isNumber()) {
                v[i] = x.asDouble();
            } else {
                throw new IOException(where + ": value " + (i + 1) + " is not a number or null");
            }
        }
        return v;
    }

    /** The bands of a stored reading, if its labels are those of {@code bands}; null otherwise. */
    static List<Band> matching(Stored s, List<Band> bands) {
        if (s.bandLabels().size() != bands.size()) {
            return null;
        }
        for (int i = 0; i < bands.size(); i++) {
            if (!bands.get(i).label().equals(s.bandLabels().get(i))) {
                return null;
            }
        }
        return bands;
    }
}
