package dev.nitid.stars;

import dev.nitid.testdata.Reference;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

/** Reads the files written by testdata/scripts/gen_star_reference.py (bundled in nitid-testdata). */
final class StarReference {
    private static final String ROOT = "/dev/nitid/testdata/stars/";

    private StarReference() {
    }

    static byte[] bytes(String name) {
        try (InputStream in = Reference.class.getResourceAsStream(ROOT + name)) {
            if (in == null) {
                throw new IllegalStateException("missing test resource " + ROOT + name
                        + ": run /usr/bin/python3 testdata/scripts/gen_star_reference.py");
            }
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** float32 little-endian raw image. */
    static float[] floats(String name) {
        ByteBuffer b = ByteBuffer.wrap(bytes(name)).order(ByteOrder.LITTLE_ENDIAN);
        float[] out = new float[b.remaining() / 4];
        b.asFloatBuffer().get(out);
        return out;
    }

    /** Numeric CSV rows, skipping '#' comments and a header line whose first field is not a number. */
    static List<double[]> rows(String name) {
        List<double[]> out = new ArrayList<>();
        for (String line : new String(bytes(name), StandardCharsets.UTF_8).split("\r?\n")) {
            if (line.isBlank() || line.startsWith("#")) {
                continue;
            }
            String[] f = line.split(",");
            try {
                double[] v = new double[f.length];
                for (int i = 0; i < f.length; i++) {
                    v[i] = Double.parseDouble(f[i].trim());
                }
                out.add(v);
            } catch (NumberFormatException e) {
                // header line
            }
        }
        return out;
    }

    /** Lines whose first field is {@code key} (and second {@code kind} if given), values after them. */
    static double[] keyed(String name, String key, String kind) {
        for (String line : new String(bytes(name), StandardCharsets.UTF_8).split("\r?\n")) {
            String[] f = line.split(",");
            int skip = kind == null ? 1 : 2;
            if (f.length > skip && f[0].equals(key) && (kind == null || f[1].equals(kind))) {
                double[] v = new double[f.length - skip];
                for (int i = 0; i < v.length; i++) {
                    v[i] = Double.parseDouble(f[i + skip]);
                }
                return v;
            }
        }
        throw new IllegalStateException("no line " + key + "," + kind + " in " + name);
    }
}
