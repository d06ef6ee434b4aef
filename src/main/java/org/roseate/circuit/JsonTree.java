package org.roseate.circuit;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.json.JsonMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;

/**
 * Reads JSON text into a Jackson tree the way {@code ObjectMapper.readTree} does with strict duplicate
 * detection and {@code FAIL_ON_TRAILING_TOKENS}, without building an {@link ObjectMapper} for the usual
 * case: a mapper loads and sets up several hundred classes (serializers, deserializers, type handling),
 * which took about half of the start-up of {@code roseate analyze}. The streaming parser of jackson-core
 * builds the tree directly from the tokens. Anything unusual (a parse error, trailing tokens, an empty
 * document, an integer beyond 64 bits, a number that is not a finite double) goes to the mapper itself,
 * so errors and edge cases come out exactly as before ({@code JsonTreeTest} compares the trees).
 */
final class JsonTree {
    private static final JsonFactory FACTORY = JsonFactory.builder()
            .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
            .build();
    private static final JsonNodeFactory NODES = JsonNodeFactory.instance;

    private JsonTree() {
    }

    /** The mapper, built on first use only (the slow path). */
    private static final class Mapper {
        static final ObjectMapper JSON = JsonMapper.builder()
                .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
                .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
                .build();
    }

    /** Thrown inside the fast path when the mapper must decide. */
    private static final class NotPlain extends Exception {
        private static final long serialVersionUID = 1L;

        NotPlain() {
            super(null, null, false, false);
        }
    }

    /** As {@code ObjectMapper.readTree(text)} with the features above: same tree, same exceptions. */
    static JsonNode read(String text) throws JsonProcessingException {
        try (JsonParser p = FACTORY.createParser(text)) {
            JsonToken first = p.nextToken();
            if (first == null) {
                throw new NotPlain();
            }
            JsonNode root = value(p, first);
            if (p.nextToken() != null) {
                throw new NotPlain();
            }
            return root;
        } catch (IOException | NotPlain | RuntimeException e) {
            return Mapper.JSON.readTree(text);
        }
    }

    private static JsonNode value(JsonParser p, JsonToken t) throws IOException, NotPlain {
        switch (t) {
            case START_OBJECT: {
                ObjectNode o = NODES.objectNode();
                for (JsonToken k = p.nextToken(); k != JsonToken.END_OBJECT; k = p.nextToken()) {
                    String name = p.currentName();
                    o.set(name, value(p, p.nextToken()));
                }
                return o;
            }
            case START_ARRAY: {
                ArrayNode a = NODES.arrayNode();
                for (JsonToken v = p.nextToken(); v != JsonToken.END_ARRAY; v = p.nextToken()) {
                    a.add(value(p, v));
                }
                return a;
            }
            case VALUE_STRING:
                return NODES.textNode(p.getText());
            case VALUE_NUMBER_INT:
                switch (p.getNumberType()) {
                    case INT:
                        return NODES.numberNode(p.getIntValue());
                    case LONG:
                        return NODES.numberNode(p.getLongValue());
                    default:
                        throw new NotPlain();
                }
            case VALUE_NUMBER_FLOAT: {
                if (p.getNumberTypeFP() != JsonParser.NumberTypeFP.UNKNOWN) {
                    throw new NotPlain();
                }
                double d = p.getDoubleValue();
                if (!Double.isFinite(d)) {
                    throw new NotPlain();
                }
                return NODES.numberNode(d);
            }
            case VALUE_TRUE:
                return NODES.booleanNode(true);
            case VALUE_FALSE:
                return NODES.booleanNode(false);
            case VALUE_NULL:
                return NODES.nullNode();
            default:
                throw new NotPlain();
        }
    }
}
