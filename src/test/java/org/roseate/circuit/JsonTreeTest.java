package org.roseate.circuit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.json.JsonMapper;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * {@link JsonTree} against the reference, Jackson's own {@code ObjectMapper.readTree} with the features
 * the design reader used before: same tree (node types included: {@code JsonNode.equals} tells an
 * {@code IntNode} from a {@code DoubleNode}), same exception message.
 */
class JsonTreeTest {
    private static final ObjectMapper REFERENCE = JsonMapper.builder()
            .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .build();

    static Stream<Path> jsonFiles() throws Exception {
        List<Path> roots = List.of(Path.of("presets"), Path.of("src/test/resources"));
        Stream<Path> all = Stream.empty();
        for (Path r : roots) {
            all = Stream.concat(all, Files.walk(r).filter(p -> p.toString().endsWith(".json")).toList().stream());
        }
        return all.sorted();
    }

    @ParameterizedTest
    @MethodSource("jsonFiles")
    void everyJsonFileOfTheProjectGivesTheReferenceTree(Path file) throws Exception {
        String text = Files.readString(file, StandardCharsets.UTF_8);
        JsonNode expected;
        try {
            expected = REFERENCE.readTree(text);
        } catch (JsonProcessingException e) {
            JsonProcessingException got = assertThrows(JsonProcessingException.class, () -> JsonTree.read(text));
            assertEquals(e.getMessage(), got.getMessage());
            return;
        }
        assertEquals(expected, JsonTree.read(text), file.toString());
    }

    @ParameterizedTest
    @ValueSource(strings = {
        "{\"a\": 1, \"b\": 2.5, \"c\": -3e-9, \"d\": [true, false, null, \"x\"], \"e\": {}}",
        "[1, 4294967296, 12345678901234567890123, 1e400, -0.0, 1E2]",
        "\"text\"", "17", "  ", "", "{\"a\": 1} {\"b\": 2}", "{\"a\": 1, \"a\": 2}", "{\"a\": [1, 2}",
        "{\"a\": {\"b\": {\"a\": 1, \"a\": 1}}}", "[[[[[[[[[[[]]]]]]]]]]]", "{\"\\u00e9t\\u00e9\": \"\\n\"}", "nul",
        "{\"a\": NaN}", "0x10", "[1,]", "{\"a\" 1}"
    })
    void edgeCasesGiveTheReferenceTreeOrTheReferenceError(String text) throws Exception {
        JsonNode expected;
        try {
            expected = REFERENCE.readTree(text);
        } catch (JsonProcessingException e) {
            JsonProcessingException got = assertThrows(JsonProcessingException.class, () -> JsonTree.read(text));
            assertEquals(e.getClass(), got.getClass(), text);
            assertEquals(e.getMessage(), got.getMessage(), text);
            return;
        }
        assertEquals(expected, JsonTree.read(text), text);
    }
}
