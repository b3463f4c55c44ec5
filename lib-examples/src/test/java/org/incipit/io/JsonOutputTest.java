package org.incipit.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.math.BigDecimal;
import java.math.BigInteger;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.incipit.core.inference.Estimate;
import org.junit.jupiter.api.Test;

class JsonOutputTest {

    private static FitSummary gamma() {
        Map<String, Double> p = new LinkedHashMap<>();
        p.put("shape", 2.5);
        p.put("rate", 0.5);
        return new FitSummary("gamma", p, new Estimate(5.0, 4.1, 6.2, 0.95, "profile"),
                new Estimate(3.2, 2.5, 4.4, 0.95, "delta"), -120.25, 244.5, 60, true);
    }

    @Test
    void fitFollowsTheContract() {
        JsonNode j = JsonOutput.read(JsonOutput.write(JsonOutput.fit(gamma())));
        List<String> keys = new ArrayList<>();
        j.fieldNames().forEachRemaining(keys::add);
        assertEquals(List.of("family", "parameters", "mean", "sd", "logLikelihood", "aic", "n", "converged"), keys);
        assertEquals("gamma", j.get("family").asText());
        List<String> params = new ArrayList<>();
        j.get("parameters").fieldNames().forEachRemaining(params::add);
        assertEquals(List.of("shape", "rate"), params, "parameters keep the family's order");
        assertEquals(2.5, j.get("parameters").get("shape").asDouble());
        assertEquals(5.0, j.get("mean").get("estimate").asDouble());
        assertEquals(4.1, j.get("mean").get("lower").asDouble());
        assertEquals(6.2, j.get("mean").get("upper").asDouble());
        assertEquals(0.95, j.get("mean").get("level").asDouble());
        assertEquals("profile", j.get("mean").get("method").asText());
        assertEquals("delta", j.get("sd").get("method").asText());
        assertEquals(-120.25, j.get("logLikelihood").asDouble());
        assertEquals(244.5, j.get("aic").asDouble());
        assertEquals(60, j.get("n").asInt());
        assertTrue(j.get("converged").asBoolean());
    }

    @Test
    void doublesRoundTripExactly() {
        double x = 0.1 + 0.2;
        JsonNode j = JsonOutput.read(JsonOutput.write(JsonOutput.estimate(new Estimate(x, x, x, 0.9, "wald"))));
        assertEquals(x, j.get("estimate").asDouble(), 0.0);
    }

    @Test
    void infiniteBoundsAreNull() {
        JsonNode j = JsonOutput.read(JsonOutput.write(JsonOutput.estimate(
                new Estimate(3, 1, Double.POSITIVE_INFINITY, 0.95, "profile"))));
        assertTrue(j.get("upper").isNull());
        assertEquals(1.0, j.get("lower").asDouble());
    }

    @Test
    void severalFits() {
        JsonNode j = JsonOutput.fits(List.of(gamma()), "gamma");
        assertEquals(1, j.get("fits").size());
        assertEquals("gamma", j.get("best").asText());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> JsonOutput.fits(List.of(gamma()), "weibull"));
        assertEquals("best must be one of the fitted families, was weibull", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> JsonOutput.fits(List.of(), "gamma"));
    }

    @Test
    void fitSummaryValidates() {
        Estimate e = new Estimate(1, 0, 2, 0.95, "wald");
        IllegalArgumentException x = assertThrows(IllegalArgumentException.class,
                () -> new FitSummary("gamma", Map.of("shape", Double.NaN), e, e, 0, 0, 1, true));
        assertEquals("parameter shape must be finite, was NaN", x.getMessage());
        x = assertThrows(IllegalArgumentException.class,
                () -> new FitSummary("gamma", Map.of("shape", 1.0), e, e, Double.NEGATIVE_INFINITY, 0, 1, true));
        assertEquals("logLikelihood must be finite, was -Infinity", x.getMessage());
        x = assertThrows(IllegalArgumentException.class,
                () -> new FitSummary("gamma", Map.of("shape", 1.0), e, e, 0, 0, 0, true));
        assertEquals("n must be >= 1, was 0", x.getMessage());
    }

    /** Every node type the results use, nested, with empty containers and awkward values. */
    private static ObjectNode everyKind() {
        ObjectNode o = JsonOutput.object();
        o.put("text", "tab\t quote\" backslash\\ newline\n é \u2003 \u0001");
        o.put("int", -7).put("long", 1L << 40).put("float", 0.1f).put("true", true).put("false", false);
        o.put("double", 0.1).put("negativeZero", -0.0).put("tiny", 4.9e-324).put("huge", 1.7976931348623157e308)
                .put("whole", 3.0).put("fraction", 14.240254484426233);
        o.put("bigInteger", new BigInteger("123456789012345678901234567890"));
        o.put("bigDecimal", new BigDecimal("1.50"));
        o.putNull("null");
        o.putObject("emptyObject");
        o.putArray("emptyArray");
        ArrayNode a = o.putArray("array");
        a.add(1).add(2.5).add("x").addNull().addObject().put("inner", JsonOutput.estimate(
                new Estimate(1, Double.NEGATIVE_INFINITY, 2, 0.9, "wald")).toString());
        a.addArray().add(JsonOutput.estimate(new Estimate(1, 0.5, Double.POSITIVE_INFINITY, 0.95, "profile")));
        o.set("fits", JsonOutput.fits(List.of(gamma()), "gamma"));
        return o;
    }

    @Test
    void writesTheSameTextAsAnIndentingObjectMapper() throws JsonProcessingException {
        // reference: jackson-databind's ObjectMapper with INDENT_OUTPUT, which wrote results before
        ObjectMapper mapper = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        for (JsonNode n : List.of(everyKind(), JsonOutput.fit(gamma()), JsonOutput.object(),
                JsonOutput.object().putArray("a"))) {
            assertEquals(mapper.writeValueAsString(n) + System.lineSeparator(), JsonOutput.write(n));
        }
    }
}
