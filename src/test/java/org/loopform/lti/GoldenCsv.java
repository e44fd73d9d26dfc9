package org.loopform.lti;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

/** Reads a comma-separated golden file from the test class path, header row skipped. */
final class GoldenCsv {

    private GoldenCsv() {
    }

    static List<String[]> rows(String resource) {
        InputStream in = GoldenCsv.class.getResourceAsStream(resource);
        if (in == null) {
            throw new IllegalStateException("missing golden file " + resource
                    + "; run python3 src/test/python/write_sampling_golden.py");
        }
        List<String[]> rows = new ArrayList<>();
        try (BufferedReader r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8))) {
            r.readLine();
            for (String line = r.readLine(); line != null; line = r.readLine()) {
                if (!line.isBlank()) {
                    rows.add(line.split(","));
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return rows;
    }

    static double[] numbers(String spaceSeparated) {
        String[] parts = spaceSeparated.trim().split(" +");
        double[] v = new double[parts.length];
        for (int i = 0; i < parts.length; i++) {
            v[i] = Double.parseDouble(parts[i]);
        }
        return v;
    }
}
