package dev.nitid.psf;

import dev.nitid.testdata.Reference;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/** Reads the bundled reference CSVs (header line, '#' comments) into rows keyed by column name. */
final class RefCsv {
    private RefCsv() {
    }

    static List<Map<String, String>> rows(String path) {
        List<Map<String, String>> out = new ArrayList<>();
        String[] header = null;
        for (String line : Reference.lines(path)) {
            if (line.startsWith("#")) {
                continue;
            }
            String[] parts = line.split(",");
            if (header == null) {
                header = parts;
                continue;
            }
            Map<String, String> row = new TreeMap<>();
            for (int i = 0; i < header.length && i < parts.length; i++) {
                row.put(header[i].trim(), parts[i].trim());
            }
            out.add(row);
        }
        return out;
    }

    /** The row whose {@code key} column equals {@code value}. */
    static Map<String, String> row(String path, String key, String value) {
        for (Map<String, String> r : rows(path)) {
            if (value.equals(r.get(key))) {
                return r;
            }
        }
        throw new IllegalArgumentException("no row " + key + "=" + value + " in " + path);
    }

    static double num(Map<String, String> row, String column) {
        return Double.parseDouble(row.get(column));
    }
}
