package org.roseate.circuit;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.json.JsonMapper;
import java.io.IOException;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.roseate.value.ComponentKind;
import org.roseate.value.Tolerance;

/**
 * Reads design files (JSON, UTF-8). Every problem becomes a {@link DesignException} with a
 * one-line message that starts with the source name; nothing else escapes.
 *
 * <pre>{@code
 * { "name": "...", "description": "...",
 *   "tolerance": { "R": "1%", "C": "5%", "C3": "2%" },
 *   "stages": [ { "kind": "inverting", "input": "R1(10k)", "feedback": "R2(360k) || C1(3n3)",
 *                 "opamp": { "gbwHz": 1e6, "openLoopGain": 1e5 } } ] }
 * }</pre>
 */
public final class DesignReader {
    /** Largest design file accepted; real designs are a few kB. */
    public static final long MAX_FILE_BYTES = 1 << 20;

    private static final ObjectMapper JSON = JsonMapper.builder()
            .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .build();
    private static final Set<String> TOP_KEYS = Set.of("name", "description", "stages", "tolerance");

    private final String source;

    private DesignReader(String source) {
        this.source = source;
    }

    /** Reads a design file; the message of any error starts with the file's name. */
    public static Design read(Path file) {
        String source = file.getFileName() == null ? file.toString() : file.getFileName().toString();
        String text;
        try {
            if (Files.isDirectory(file)) {
                throw new DesignException(source + ": is a folder, not a design file");
            }
            if (Files.size(file) > MAX_FILE_BYTES) {
                throw new DesignException(source + ": too large for a design file (" + Files.size(file)
                        + " bytes; the limit is " + MAX_FILE_BYTES + ")");
            }
            byte[] bytes = Files.readAllBytes(file);
            text = StandardCharsets.UTF_8.newDecoder()
                    .onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT)
                    .decode(java.nio.ByteBuffer.wrap(bytes)).toString();
        } catch (NoSuchFileException e) {
            throw new DesignException(source + ": no such file");
        } catch (CharacterCodingException e) {
            throw new DesignException(source + ": not UTF-8 text");
        } catch (IOException e) {
            throw new DesignException(source + ": cannot read (" + e.getMessage() + ")");
        }
        return parse(text, source);
    }

    /** Reads design text; {@code source} names it in messages (a file name, or "editor"). */
    public static Design parse(String jsonText, String source) {
        return new DesignReader(source).design(jsonText);
    }

    private Design design(String jsonText) {
        JsonNode root;
        try {
            root = JSON.readTree(jsonText);
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            String where = at == null ? "" : " at line " + at.getLineNr() + ", column " + at.getColumnNr();
            throw fail("invalid JSON" + where + ": " + firstLine(e.getOriginalMessage()));
        }
        if (root == null || root.isMissingNode()) {
            throw fail("empty file: expected a JSON object with keys name, description and stages");
        }
        if (!root.isObject()) {
            throw fail("expected a JSON object with keys name, description and stages, found " + describe(root));
        }
        checkKeys(root, TOP_KEYS, "");
        String name = requiredText(root, "name", "");
        String description = root.has("description") ? requiredText(root, "description", "") : "";
        JsonNode stagesNode = root.get("stages");
        if (stagesNode == null) {
            throw fail("missing key 'stages' (a list of stage objects)");
        }
        if (!stagesNode.isArray()) {
            throw fail("'stages' must be a list of stage objects, found " + describe(stagesNode));
        }
        if (stagesNode.isEmpty()) {
            throw fail("'stages' is empty: a design needs at least one stage");
        }
        List<Stage> stages = new ArrayList<>();
        for (int i = 0; i < stagesNode.size(); i++) {
            stages.add(stage(stagesNode.get(i), i + 1));
        }
        checkDuplicateDesignators(stages);
        Map<String, Tolerance> tolerances = tolerances(root.get("tolerance"), stages);
        return new Design(name, description, stages, tolerances);
    }

    private Stage stage(JsonNode node, int number) {
        String at = "stage " + number;
        if (!node.isObject()) {
            throw fail(at + ": expected a stage object with a 'kind', found " + describe(node));
        }
        JsonNode kindNode = node.get("kind");
        if (kindNode == null) {
            throw fail(at + ": missing key 'kind' (inverting, noninverting or divider)");
        }
        if (!kindNode.isTextual()) {
            throw fail(at + ": 'kind' must be a string (inverting, noninverting or divider), found " + describe(kindNode));
        }
        String kind = kindNode.asText();
        switch (kind) {
            case InvertingStage.KIND -> {
                checkKeys(node, Set.of("kind", "input", "feedback", "opamp"), at + " (inverting)");
                return new InvertingStage(network(node, "input", number), network(node, "feedback", number),
                        opamp(node.get("opamp"), number));
            }
            case NonInvertingStage.KIND -> {
                checkKeys(node, Set.of("kind", "ground", "feedback", "opamp"), at + " (noninverting)");
                return new NonInvertingStage(network(node, "ground", number), network(node, "feedback", number),
                        opamp(node.get("opamp"), number));
            }
            case DividerStage.KIND -> {
                checkKeys(node, Set.of("kind", "series", "shunt", "load"), at + " (divider)");
                Optional<Network> load = node.has("load") ? Optional.of(network(node, "load", number)) : Optional.empty();
                return new DividerStage(network(node, "series", number), network(node, "shunt", number), load);
            }
            default -> throw fail(at + ": unknown kind '" + kind + "'; expected inverting, noninverting or divider");
        }
    }

    private Network network(JsonNode stage, String role, int number) {
        JsonNode n = stage.get(role);
        String at = "stage " + number + " " + role;
        if (n == null) {
            throw fail("stage " + number + " (" + stage.get("kind").asText() + "): missing key '" + role + "'");
        }
        if (!n.isTextual()) {
            throw fail(at + ": expected a network such as \"R1(10k) || C1(22n)\", found " + describe(n));
        }
        try {
            return NetworkParser.parse(n.asText());
        } catch (NetworkSyntaxException e) {
            throw new DesignException(source + ": " + at + ", column " + e.column() + ": " + e.detail(),
                    number, role, e.column());
        }
    }

    private Optional<OpAmp> opamp(JsonNode n, int number) {
        if (n == null) {
            return Optional.empty();
        }
        String at = "stage " + number + " opamp";
        if (!n.isObject()) {
            throw fail(at + ": expected an object such as {\"gbwHz\": 1e6, \"openLoopGain\": 1e5}, found " + describe(n));
        }
        checkKeys(n, Set.of("gbwHz", "openLoopGain"), at);
        JsonNode gbw = n.get("gbwHz");
        if (gbw == null) {
            throw fail(at + ": missing key 'gbwHz' (gain-bandwidth product in Hz, e.g. 1e6)");
        }
        double gbwHz = positiveNumber(gbw, at + " gbwHz");
        JsonNode a0 = n.get("openLoopGain");
        double gain = a0 == null ? OpAmp.DEFAULT_OPEN_LOOP_GAIN : positiveNumber(a0, at + " openLoopGain");
        return Optional.of(new OpAmp(gbwHz, gain));
    }

    private double positiveNumber(JsonNode n, String at) {
        if (!n.isNumber()) {
            throw fail(at + ": expected a number, found " + describe(n));
        }
        double v = n.asDouble();
        if (!(v > 0) || !Double.isFinite(v)) {
            throw fail(at + ": must be a finite number > 0, found " + n.asText());
        }
        return v;
    }

    private Map<String, Tolerance> tolerances(JsonNode n, List<Stage> stages) {
        Map<String, Tolerance> map = new LinkedHashMap<>();
        if (n == null) {
            return map;
        }
        if (!n.isObject()) {
            throw fail("'tolerance' must be an object such as {\"R\": \"1%\", \"C\": \"5%\"}, found " + describe(n));
        }
        Set<String> designators = new java.util.HashSet<>();
        stages.forEach(s -> s.networks().values().forEach(net -> net.forEachComponent(c -> designators.add(c.designator()))));
        Iterator<Map.Entry<String, JsonNode>> it = n.fields();
        while (it.hasNext()) {
            Map.Entry<String, JsonNode> e = it.next();
            String key = e.getKey();
            boolean kindKey = key.length() == 1 && ComponentKind.ofLetter(key.charAt(0)).isPresent();
            if (!kindKey && !designators.contains(key)) {
                throw fail("tolerance: unknown key '" + key + "'; expected a kind letter (R, C, L) or a designator of this design");
            }
            if (!e.getValue().isTextual()) {
                throw fail("tolerance " + key + ": expected a percentage such as \"1%\", found " + describe(e.getValue()));
            }
            try {
                map.put(key, Tolerance.parse(e.getValue().asText()));
            } catch (IllegalArgumentException ex) {
                throw fail("tolerance " + key + ": " + ex.getMessage());
            }
        }
        return map;
    }

    private void checkDuplicateDesignators(List<Stage> stages) {
        Map<String, String> firstSeen = new LinkedHashMap<>();
        for (int i = 0; i < stages.size(); i++) {
            for (Map.Entry<String, Network> e : stages.get(i).networks().entrySet()) {
                String where = "stage " + (i + 1) + " " + e.getKey();
                for (Component c : e.getValue().components()) {
                    String before = firstSeen.putIfAbsent(c.designator(), where);
                    if (before != null) {
                        throw fail("designator " + c.designator() + " is used twice (" + before + " and " + where
                                + "); each part needs its own designator");
                    }
                }
            }
        }
    }

    private String requiredText(JsonNode node, String key, String at) {
        JsonNode n = node.get(key);
        if (n == null) {
            throw fail(at + "missing key '" + key + "'");
        }
        if (!n.isTextual()) {
            throw fail(at + "'" + key + "' must be a string, found " + describe(n));
        }
        return n.asText();
    }

    private void checkKeys(JsonNode node, Set<String> allowed, String at) {
        Iterator<String> names = node.fieldNames();
        while (names.hasNext()) {
            String k = names.next();
            if (!allowed.contains(k)) {
                List<String> sorted = new ArrayList<>(allowed);
                java.util.Collections.sort(sorted);
                throw fail((at.isEmpty() ? "" : at + ": ") + "unknown key '" + k + "'; expected one of " + String.join(", ", sorted));
            }
        }
    }

    private static String describe(JsonNode n) {
        return switch (n.getNodeType()) {
            case ARRAY -> "a list";
            case OBJECT -> "an object";
            case NUMBER -> "the number " + n.asText();
            case BOOLEAN -> n.asText();
            case NULL -> "null";
            case STRING -> "the string \"" + n.asText() + "\"";
            default -> n.getNodeType().toString().toLowerCase(java.util.Locale.ROOT);
        };
    }

    /** Jackson's message, first line only, without its source-location annotations. */
    private static String firstLine(String s) {
        if (s == null) {
            return "unreadable";
        }
        int nl = s.indexOf('\n');
        String line = nl < 0 ? s : s.substring(0, nl);
        // "(start marker at [Source: …; line: 1, column: 25])" → "(opened at line 1, column 25)"
        line = line.replaceAll("\\(start marker at \\[Source: [^;]*; line: (\\d+), column: (\\d+)\\]\\)",
                "(opened at line $1, column $2)");
        return line.replaceAll("\\s*\\[Source: [^\\]]*\\]", "").strip();
    }

    private DesignException fail(String message) {
        return new DesignException(source + ": " + message);
    }

}
