package org.roseate.listen;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * The JSON trial log of an ABX test. Written after every answer, so an interrupted test keeps what
 * was answered; {@code complete} says whether every planned trial was answered, and only then are
 * {@code correct}, {@code pValue} and {@code smallestSignificantCount} present.
 *
 * <pre>
 * { "a": "bench-pink.json", "b": "ideal-pink", "levelDbfs": -30.0, "seed": 7, "trials": 16,
 *   "complete": true, "correct": 12, "pValue": 0.0384, "smallestSignificantCount": 12,
 *   "trialLog": [ { "trial": 1, "time": "2026-12-02T02:50:01.123Z", "x": "A", "answer": "B",
 *                   "switches": 5, "seconds": 21.4, "correct": false }, ... ] }
 * </pre>
 *
 * @param a         what A was (design file name, {@code ideal-pink} or {@code white})
 * @param b         what B was
 * @param levelDbfs the common RMS level, dBFS
 * @param seed      the trial-order seed
 * @param trials    planned number of trials
 * @param log       answered trials, in order
 */
public record AbxLog(String a, String b, double levelDbfs, long seed, int trials, List<AbxTrial> log) {
    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    public AbxLog {
        Objects.requireNonNull(a, "a");
        Objects.requireNonNull(b, "b");
        log = List.copyOf(log);
        if (log.size() > trials) {
            throw new IllegalArgumentException("log has " + log.size() + " trials, more than the " + trials + " planned");
        }
    }

    /** Every planned trial answered. */
    public boolean complete() {
        return log.size() == trials;
    }

    /** The JSON text. */
    public String toJson() {
        ObjectNode root = JSON.createObjectNode();
        root.put("a", a);
        root.put("b", b);
        root.put("levelDbfs", levelDbfs);
        root.put("seed", seed);
        root.put("trials", trials);
        root.put("complete", complete());
        if (complete()) {
            AbxOutcome o = AbxOutcome.of(log);
            root.put("correct", o.correct());
            root.put("pValue", o.pValue());
            root.put("smallestSignificantCount", o.smallestSignificantCount());
        }
        ArrayNode arr = root.putArray("trialLog");
        for (AbxTrial t : log) {
            ObjectNode n = arr.addObject();
            n.put("trial", t.number());
            n.put("time", t.time().toString());
            n.put("x", t.x().name());
            n.put("answer", t.answer().name());
            n.put("switches", t.switches());
            n.put("seconds", t.seconds());
            n.put("correct", t.correct());
        }
        try {
            return JSON.writeValueAsString(root) + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /**
     * Reads a log written by {@link #toJson()}.
     *
     * @throws IllegalArgumentException one line naming the first bad or missing key
     */
    public static AbxLog fromJson(String text) {
        JsonNode root;
        try {
            root = JSON.readTree(text);
        } catch (JsonProcessingException e) {
            throw new IllegalArgumentException("not a listening-test log: invalid JSON (" + e.getOriginalMessage() + ")");
        }
        if (root == null || !root.isObject()) {
            throw new IllegalArgumentException("not a listening-test log: expected a JSON object");
        }
        List<AbxTrial> trials = new ArrayList<>();
        JsonNode arr = required(root, "trialLog");
        for (JsonNode n : arr) {
            Instant time;
            try {
                time = Instant.parse(required(n, "time").asText());
            } catch (DateTimeParseException e) {
                throw new IllegalArgumentException("trialLog: 'time' is not an ISO-8601 instant: " + n.get("time").asText());
            }
            trials.add(new AbxTrial(required(n, "trial").asInt(), time, side(n, "x"), side(n, "answer"),
                    required(n, "switches").asInt(), required(n, "seconds").asDouble()));
        }
        return new AbxLog(required(root, "a").asText(), required(root, "b").asText(), required(root, "levelDbfs").asDouble(),
                required(root, "seed").asLong(), required(root, "trials").asInt(), trials);
    }

    private static JsonNode required(JsonNode n, String key) {
        JsonNode v = n.get(key);
        if (v == null || v.isNull()) {
            throw new IllegalArgumentException("listening-test log: missing key '" + key + "'");
        }
        return v;
    }

    private static Side side(JsonNode n, String key) {
        String s = required(n, key).asText();
        try {
            return Side.valueOf(s);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException("listening-test log: '" + key + "' must be A or B, found '" + s + "'");
        }
    }
}
