package org.incipit.io;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Map;
import org.incipit.core.inference.Estimate;

/**
 * JSON form of results (Jackson). Contract:
 * <pre>
 * estimate: {"estimate":x,"lower":l,"upper":u,"level":0.95,"method":"profile"}
 * fit:      {"family":"gamma","parameters":{"shape":..,"rate":..},"mean":estimate,"sd":estimate,
 *            "logLikelihood":..,"aic":..,"n":..,"converged":true}
 * fits:     {"fits":[fit,...],"best":"gamma"}
 * </pre>
 * JSON has no infinities: an infinite interval bound is written as {@code null}. Numbers are
 * written with Java's shortest round-trip representation.
 */
public final class JsonOutput {

    // Trees are built with the node factory and written with a jackson-core generator: an
    // ObjectMapper costs about 0.1-0.2 s to set up at start-up, more than the rest of writing a
    // result. The text is the same as that of an ObjectMapper with INDENT_OUTPUT (tested).
    private static final JsonFactory FACTORY = new JsonFactory();

    private JsonOutput() {
    }

    /** Made on first use: only {@link #read} needs it. */
    private static final class Mapper {
        static final ObjectMapper MAPPER = new ObjectMapper();
    }

    /** @return a new empty JSON object */
    public static ObjectNode object() {
        return JsonNodeFactory.instance.objectNode();
    }

    /**
     * @param e an estimate
     * @return {@code {"estimate","lower","upper","level","method"}}
     */
    public static ObjectNode estimate(Estimate e) {
        ObjectNode o = object();
        o.put("estimate", e.estimate());
        putBound(o, "lower", e.lower());
        putBound(o, "upper", e.upper());
        o.put("level", e.level());
        o.put("method", e.method());
        return o;
    }

    private static void putBound(ObjectNode o, String name, double v) {
        if (Double.isFinite(v)) {
            o.put(name, v);
        } else {
            o.putNull(name);
        }
    }

    /**
     * @param fit a fitted family
     * @return the fit object of the contract
     */
    public static ObjectNode fit(FitSummary fit) {
        ObjectNode o = object();
        o.put("family", fit.family());
        ObjectNode p = o.putObject("parameters");
        for (Map.Entry<String, Double> e : fit.parameters().entrySet()) {
            p.put(e.getKey(), e.getValue());
        }
        o.set("mean", estimate(fit.mean()));
        o.set("sd", estimate(fit.sd()));
        o.put("logLikelihood", fit.logLikelihood());
        o.put("aic", fit.aic());
        o.put("n", fit.n());
        o.put("converged", fit.converged());
        return o;
    }

    /**
     * @param fits several fitted families, at least one
     * @param best the family chosen (e.g. least AIC); must be one of the fits
     * @return {@code {"fits":[...],"best":best}}
     * @throws IllegalArgumentException if {@code fits} is empty or {@code best} is not among them
     */
    public static ObjectNode fits(List<FitSummary> fits, String best) {
        if (fits.isEmpty()) {
            throw new IllegalArgumentException("fits must not be empty");
        }
        if (fits.stream().noneMatch(f -> f.family().equals(best))) {
            throw new IllegalArgumentException("best must be one of the fitted families, was " + best);
        }
        ObjectNode o = object();
        ArrayNode a = o.putArray("fits");
        for (FitSummary f : fits) {
            a.add(fit(f));
        }
        o.put("best", best);
        return o;
    }

    /**
     * @param node a JSON value
     * @return its text, indented, ending in a newline
     */
    public static String write(JsonNode node) {
        StringWriter w = new StringWriter();
        try (JsonGenerator g = FACTORY.createGenerator(w)) {
            g.useDefaultPrettyPrinter();
            write(g, node);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write JSON", e);
        }
        return w + System.lineSeparator();
    }

    private static void write(JsonGenerator g, JsonNode node) throws IOException {
        switch (node.getNodeType()) {
            case OBJECT -> {
                g.writeStartObject();
                for (Map.Entry<String, JsonNode> e : node.properties()) {
                    g.writeFieldName(e.getKey());
                    write(g, e.getValue());
                }
                g.writeEndObject();
            }
            case ARRAY -> {
                g.writeStartArray();
                for (JsonNode e : node) {
                    write(g, e);
                }
                g.writeEndArray();
            }
            case STRING -> g.writeString(node.textValue());
            case BOOLEAN -> g.writeBoolean(node.booleanValue());
            case NULL -> g.writeNull();
            case NUMBER -> {
                switch (node.numberType()) {
                    case INT -> g.writeNumber(node.intValue());
                    case LONG -> g.writeNumber(node.longValue());
                    case FLOAT -> g.writeNumber(node.floatValue());
                    case DOUBLE -> g.writeNumber(node.doubleValue());
                    case BIG_INTEGER -> g.writeNumber(node.bigIntegerValue());
                    case BIG_DECIMAL -> g.writeNumber(node.decimalValue());
                    default -> throw new IllegalArgumentException("cannot write a JSON number of type "
                            + node.numberType());
                }
            }
            default -> throw new IllegalArgumentException("cannot write a JSON node of type " + node.getNodeType()
                    + " (results hold objects, arrays, strings, numbers, booleans and nulls)");
        }
    }

    /**
     * @param text JSON text
     * @return the parsed tree (for tests and for reading results back)
     * @throws IllegalArgumentException if the text is not JSON
     */
    public static JsonNode read(String text) {
        try {
            return Mapper.MAPPER.readTree(text);
        } catch (JsonProcessingException e) {
            throw new IllegalArgumentException("not JSON: " + e.getOriginalMessage(), e);
        }
    }
}
