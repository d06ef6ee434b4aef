package org.roseate.spectrum;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;

/** Reads reference/spectrum/welch.json, written by src/test/python/gen_spectrum_reference.py. */
final class SpectrumReference {
    private static JsonNode cached;

    private SpectrumReference() {
    }

    static synchronized JsonNode welch() {
        if (cached == null) {
            try (InputStream in = SpectrumReference.class.getResourceAsStream("/reference/spectrum/welch.json")) {
                if (in == null) {
                    throw new IllegalStateException("missing test resource /reference/spectrum/welch.json");
                }
                cached = new ObjectMapper().readTree(in);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }
        return cached;
    }

    static double[] doubles(JsonNode array) {
        double[] out = new double[array.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = array.get(i).asDouble();
        }
        return out;
    }

    /** Seeded Gaussian white noise of standard deviation sigma (L64X128MixRandom, so nearby seeds are independent). */
    static double[] gaussian(long seed, int n, double sigma) {
        RandomGenerator r = RandomGeneratorFactory.<RandomGenerator>of("L64X128MixRandom").create(seed);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = sigma * r.nextGaussian();
        }
        return x;
    }

    static WelchSettings settings(JsonNode c) {
        WelchSettings s = WelchSettings.of(c.get("nperseg").asInt())
                .withWindow(Window.parse(c.get("window").asText()).orElseThrow())
                .withDetrend(c.get("detrend").asText().equals("constant") ? WelchSettings.Detrend.CONSTANT
                        : WelchSettings.Detrend.NONE);
        if (s.overlapSamples() != c.get("noverlap").asInt()) {
            throw new IllegalStateException("overlap mismatch");
        }
        return s;
    }
}
