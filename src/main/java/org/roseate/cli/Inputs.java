package org.roseate.cli;

import java.nio.file.Path;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;

/** Shared reading of command-line inputs, with one-line messages for bad ones. */
final class Inputs {
    private Inputs() {
    }

    /** Reads a design file and builds its model; errors name the file. */
    static CircuitModel model(Path file) {
        Design d = DesignReader.read(file);
        return CircuitModel.of(d, file.getFileName().toString());
    }

    static FrequencyRange range(String text) {
        try {
            return FrequencyRange.parse(text);
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--range: " + e.getMessage());
        }
    }

    static TargetSlope slope(String text) {
        try {
            return TargetSlope.parse(text);
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--slope: " + e.getMessage());
        }
    }

    /** "100,1000,1e4" or "1k,2k" → Hz. */
    static double[] frequencies(String text, String option) {
        String[] parts = text.split(",");
        double[] f = new double[parts.length];
        for (int i = 0; i < parts.length; i++) {
            try {
                f[i] = FrequencyRange.hz(parts[i], text);
            } catch (IllegalArgumentException e) {
                throw new UserInputException(option + ": " + e.getMessage());
            }
        }
        return f;
    }
}
