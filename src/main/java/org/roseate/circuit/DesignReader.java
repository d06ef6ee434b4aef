package org.roseate.circuit;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
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

    private static final Set<String> TOP_KEYS = Set.of("name", "description", "stages", "tolerance", "source",
            "temperatureC");
    /** The op-amp keys for noise and limits, read by {@link #opAmpNoise}. */
    private static final List<String> NOISE_KEYS = List.of("enVPerRtHz", "inAPerRtHz", "enCornerHz", "inCornerHz", "swingV",
            "slewVPerUs");

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
            root = JsonTree.read(jsonText);
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            String where = at == null ? "" : " at line " + at.getLineNr() + ", column " + at.getColumnNr();
            String duplicate = duplicateKey(e, at);
            if (duplicate != null) {
                throw fail(duplicate);
            }
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
        Optional<SourceNoise> noiseSource = sourceNoise(root.get("source"));
        double temperatureC = Design.DEFAULT_TEMPERATURE_C;
        JsonNode t = root.get("temperatureC");
        if (t != null) {
            if (!t.isNumber()) {
                throw fail("temperatureC: expected a number in °C, found " + describe(t));
            }
            temperatureC = t.asDouble();
            if (!Double.isFinite(temperatureC) || temperatureC < -273.15 || temperatureC > 1000) {
                throw fail("temperatureC: must be between -273.15 and 1000 °C, found " + t.asText());
            }
            if (temperatureC == -273.15) {
                throw fail("temperatureC: absolute zero is out of range; expected a temperature above -273.15 °C");
            }
        }
        return new Design(name, description, stages, tolerances, noiseSource, temperatureC);
    }

    /** The optional {@code "source": {"densityVPerRtHz": 150e-6, "flickerCornerHz": 250}}. */
    private Optional<SourceNoise> sourceNoise(JsonNode n) {
        if (n == null) {
            return Optional.empty();
        }
        if (!n.isObject()) {
            throw fail("source: expected an object such as {\"densityVPerRtHz\": 150e-6, \"flickerCornerHz\": 250}, found "
                    + describe(n));
        }
        checkKeys(n, Set.of("densityVPerRtHz", "flickerCornerHz"), "source");
        JsonNode d = n.get("densityVPerRtHz");
        if (d == null) {
            throw fail("source: missing key 'densityVPerRtHz' (the source's white density in V/√Hz, e.g. 150e-6)");
        }
        double density = positiveNumber(d, "source densityVPerRtHz");
        JsonNode c = n.get("flickerCornerHz");
        double corner = c == null ? 0 : nonNegativeNumber(c, "source flickerCornerHz");
        return Optional.of(new SourceNoise(density, corner));
    }

    private double nonNegativeNumber(JsonNode n, String at) {
        if (!n.isNumber()) {
            throw fail(at + ": expected a number, found " + describe(n));
        }
        double v = n.asDouble();
        if (!(v >= 0) || !Double.isFinite(v)) {
            throw fail(at + ": must be a finite number >= 0, found " + n.asText());
        }
        return v;
    }

    private Stage stage(JsonNode node, int number) {
        String at = "stage " + number;
        if (!node.isObject()) {
            throw fail(at + ": expected a stage object with a 'kind', found " + describe(node));
        }
        JsonNode kindNode = node.get("kind");
        if (kindNode == null) {
            throw fail(at + ": missing key 'kind' (inverting, noninverting, divider or circuit)");
        }
        if (!kindNode.isTextual()) {
            throw fail(at + ": 'kind' must be a string (inverting, noninverting, divider or circuit), found " + describe(kindNode));
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
            case CircuitStage.KIND -> {
                return circuit(node, number);
            }
            default -> throw fail(at + ": unknown kind '" + kind + "'; expected inverting, noninverting, divider or circuit");
        }
    }

    private Network network(JsonNode stage, String role, int number) {
        JsonNode n = stage.get(role);
        if (n == null) {
            throw fail("stage " + number + " (" + stage.get("kind").asText() + "): missing key '" + role + "'");
        }
        return network(n, "stage " + number + " " + role, number, role);
    }

    /** Parses a network expression; {@code role} is the key path the editor marks. */
    private Network network(JsonNode n, String at, int number, String role) {
        if (!n.isTextual()) {
            throw new DesignException(source + ": " + at + ": expected a network such as \"R1(10k) || C1(22n)\", found "
                    + describe(n), number, role, 0);
        }
        try {
            return NetworkParser.parse(n.asText());
        } catch (NetworkSyntaxException e) {
            throw new DesignException(source + ": " + at + ", column " + e.column() + ": " + e.detail(),
                    number, role, e.column());
        }
    }

    /**
     * A {@code circuit} stage. Keys: {@code input}, {@code output} (node names), {@code branches}
     * ("n1 n2" → network), {@code opamps} (designator → {@code plus}, {@code minus},
     * {@code output} and the op-amp model keys). Errors name the stage and the key path, e.g.
     * {@code stage 2 (circuit) opamps U1 plus: unknown node 'x'; …}; the exception's role is the
     * key path joined by {@link #PATH_SEPARATOR} for the editor.
     */
    private Stage circuit(JsonNode node, int number) {
        String at = "stage " + number + " (circuit)";
        checkKeys(node, Set.of("kind", "input", "output", "branches", "opamps"), at);
        String input = nodeName(node, "input", at, number);
        String output = nodeName(node, "output", at, number);
        JsonNode br = node.get("branches");
        if (br == null) {
            throw stageFail(at + ": missing key 'branches' (an object such as {\"in out\": \"R1(10k)\", \"out gnd\": \"C1(10n)\"})", number, null);
        }
        if (!br.isObject()) {
            throw stageFail(at + " branches: expected an object such as {\"in out\": \"R1(10k)\"}, found " + describe(br), number, "branches");
        }
        Map<String, Network> branches = new LinkedHashMap<>();
        Iterator<Map.Entry<String, JsonNode>> it = br.fields();
        while (it.hasNext()) {
            Map.Entry<String, JsonNode> e = it.next();
            String key = e.getKey();
            String role = "branches" + PATH_SEPARATOR + key;
            if (CircuitStage.nodesOf(key).isEmpty()) {
                throw stageFail(at + " branches '" + key + "': a branch key must be two node names (letters, digits, _) "
                        + "separated by one space, such as \"in a\"", number, role);
            }
            branches.put(key, network(e.getValue(), "stage " + number + " branch '" + key + "'", number, role));
        }
        Map<String, CircuitOpAmp> opamps = new LinkedHashMap<>();
        JsonNode ops = node.get("opamps");
        if (ops != null) {
            if (!ops.isObject()) {
                throw stageFail(at + " opamps: expected an object keyed by designator, such as "
                        + "{\"U1\": {\"plus\": \"a\", \"minus\": \"out\", \"output\": \"out\"}}, found " + describe(ops), number, "opamps");
            }
            Iterator<Map.Entry<String, JsonNode>> oi = ops.fields();
            while (oi.hasNext()) {
                Map.Entry<String, JsonNode> e = oi.next();
                opamps.put(e.getKey(), circuitOpAmp(e.getKey(), e.getValue(), at, number));
            }
        }
        Optional<CircuitStage.Problem> p = CircuitStage.problem(input, output, branches, opamps);
        if (p.isPresent()) {
            String key = p.get().key();
            String role = key.startsWith("branches '")
                    ? "branches" + PATH_SEPARATOR + key.substring("branches '".length(), key.length() - 1)
                    : key.replace(" ", PATH_SEPARATOR);
            throw stageFail(at + " " + key + ": " + p.get().message(), number, role);
        }
        return new CircuitStage(input, output, branches, opamps);
    }

    /** Separator of the key path in a circuit error's role, e.g. {@code opamps/U1/plus}. */
    public static final String PATH_SEPARATOR = "/";

    private static final java.util.regex.Pattern DESIGNATOR = java.util.regex.Pattern.compile("[A-Za-z][A-Za-z0-9_]*");

    private CircuitOpAmp circuitOpAmp(String designator, JsonNode n, String stageAt, int number) {
        String at = stageAt + " opamps " + designator;
        String role = "opamps" + PATH_SEPARATOR + designator;
        if (!DESIGNATOR.matcher(designator).matches()) {
            throw stageFail(at + ": expected a designator such as U1 (a letter, then letters, digits or _)", number, role);
        }
        if (!n.isObject()) {
            throw stageFail(at + ": expected an object such as {\"plus\": \"a\", \"minus\": \"out\", \"output\": \"out\"}, found "
                    + describe(n), number, role);
        }
        checkKeys(n, withNoiseKeys("plus", "minus", "output", "gbwHz", "openLoopGain"), at);
        String[] pins = new String[3];
        String[] names = {"plus", "minus", "output"};
        for (int i = 0; i < 3; i++) {
            JsonNode v = n.get(names[i]);
            if (v == null) {
                throw stageFail(at + ": missing key '" + names[i] + "' (a node name)", number, role);
            }
            if (!v.isTextual() || !CircuitStage.isNodeName(v.asText())) {
                throw stageFail(at + " " + names[i] + ": expected a node name (letters, digits, _), found " + describe(v),
                        number, role + PATH_SEPARATOR + names[i]);
            }
            pins[i] = v.asText();
        }
        return new CircuitOpAmp(pins[0], pins[1], pins[2], opAmpModel(n, at, number, role, true));
    }

    /**
     * The op-amp model keys of an op-amp object ({@code gbwHz}, {@code openLoopGain}); with
     * {@code idealWithoutGbw}, a missing {@code gbwHz} means the ideal op-amp. New model keys are
     * read here.
     */
    private OpAmp opAmpModel(JsonNode n, String at, int number, String role, boolean idealWithoutGbw) {
        JsonNode gbw = n.get("gbwHz");
        JsonNode a0 = n.get("openLoopGain");
        if (gbw == null) {
            boolean noiseOnly = NOISE_KEYS.stream().anyMatch(n::has) && a0 == null;
            if (!idealWithoutGbw && !noiseOnly) {
                throw fail(at + ": missing key 'gbwHz' (gain-bandwidth product in Hz, e.g. 1e6)");
            }
            if (a0 != null) {
                throw stageFail(at + " openLoopGain: needs gbwHz as well (without gbwHz the op-amp is ideal)", number,
                        role + PATH_SEPARATOR + "openLoopGain");
            }
            return OpAmp.IDEAL.withNoise(opAmpNoise(n, at));
        }
        double gbwHz = positiveNumber(gbw, at + " gbwHz");
        double gain = a0 == null ? OpAmp.DEFAULT_OPEN_LOOP_GAIN : positiveNumber(a0, at + " openLoopGain");
        return new OpAmp(gbwHz, gain, opAmpNoise(n, at));
    }

    private static Set<String> withNoiseKeys(String... keys) {
        Set<String> s = new java.util.HashSet<>(List.of(keys));
        s.addAll(NOISE_KEYS);
        return s;
    }

    /**
     * The noise and limit keys of an op-amp object: {@code enVPerRtHz}, {@code inAPerRtHz} (white
     * densities, ≥ 0), {@code enCornerHz}, {@code inCornerHz} (1/f corners, ≥ 0), {@code swingV}
     * (peak output swing, &gt; 0), {@code slewVPerUs} (&gt; 0); each optional.
     */
    private OpAmp.Noise opAmpNoise(JsonNode n, String at) {
        double[] v = {0, 0, 0, 0, Double.NaN, Double.NaN};
        for (int i = 0; i < NOISE_KEYS.size(); i++) {
            JsonNode k = n.get(NOISE_KEYS.get(i));
            if (k != null) {
                v[i] = i < 4 ? nonNegativeNumber(k, at + " " + NOISE_KEYS.get(i)) : positiveNumber(k, at + " " + NOISE_KEYS.get(i));
            }
        }
        return new OpAmp.Noise(v[0], v[1], v[2], v[3], v[4], v[5]);
    }

    private String nodeName(JsonNode stage, String key, String at, int number) {
        JsonNode v = stage.get(key);
        if (v == null) {
            throw stageFail(at + ": missing key '" + key + "' (a node name such as \"" + ("input".equals(key) ? "in" : "out") + "\")", number, null);
        }
        if (!v.isTextual() || !CircuitStage.isNodeName(v.asText())) {
            throw stageFail(at + " " + key + ": expected a node name (letters, digits, _), found " + describe(v), number, key);
        }
        return v.asText();
    }

    private DesignException stageFail(String message, int number, String role) {
        return new DesignException(source + ": " + message, number, role, 0);
    }

    private Optional<OpAmp> opamp(JsonNode n, int number) {
        if (n == null) {
            return Optional.empty();
        }
        String at = "stage " + number + " opamp";
        if (!n.isObject()) {
            throw fail(at + ": expected an object such as {\"gbwHz\": 1e6, \"openLoopGain\": 1e5}, found " + describe(n));
        }
        checkKeys(n, withNoiseKeys("gbwHz", "openLoopGain"), at);
        return Optional.of(opAmpModel(n, at, number, "opamp", false));
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
            Stage st = stages.get(i);
            for (Map.Entry<String, Network> e : st.networks().entrySet()) {
                String where = "stage " + (i + 1) + (st instanceof CircuitStage ? " branch '" + e.getKey() + "'" : " " + e.getKey());
                for (Component c : e.getValue().components()) {
                    seen(firstSeen, c.designator(), where);
                }
            }
            if (st instanceof CircuitStage c) {
                for (String u : c.opamps().keySet()) {
                    seen(firstSeen, u, "stage " + (i + 1) + " opamps");
                }
            }
        }
    }

    private void seen(Map<String, String> firstSeen, String designator, String where) {
        String before = firstSeen.putIfAbsent(designator, where);
        if (before != null) {
            throw fail("designator " + designator + " is used twice (" + before + " and " + where
                    + "); each part needs its own designator");
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

    /**
     * Strict duplicate detection's error, with its place in the design's own terms:
     * "stage 1 branches: key 'in a' appears twice (line 1, column 116); each key may appear once".
     */
    private static String duplicateKey(JsonProcessingException e, JsonLocation at) {
        String m = e.getOriginalMessage();
        java.util.regex.Matcher k = java.util.regex.Pattern.compile("^Duplicate field '(.*)'").matcher(m == null ? "" : m);
        if (!k.find()) {
            return null;
        }
        StringBuilder place = new StringBuilder();
        if (e.getProcessor() instanceof com.fasterxml.jackson.core.JsonParser p) {
            String[] parts = p.getParsingContext().getParent() == null ? new String[0]
                    : p.getParsingContext().getParent().pathAsPointer().toString().split("/");
            for (int i = 1; i < parts.length; i++) {
                String part = parts[i].replace("~1", "/").replace("~0", "~");
                if (i == 2 && "stages".equals(parts[1]) && part.matches("\\d+")) {
                    place.setLength(0);
                    place.append("stage ").append(Integer.parseInt(part) + 1);
                } else if (!(i == 1 && "stages".equals(part))) {
                    place.append(place.length() == 0 ? "" : " ").append(part);
                }
            }
        }
        String where = at == null ? "" : " (line " + at.getLineNr() + ", column " + at.getColumnNr() + ")";
        return (place.length() == 0 ? "" : place + ": ") + "key '" + k.group(1) + "' appears twice" + where
                + "; each key may appear once";
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
