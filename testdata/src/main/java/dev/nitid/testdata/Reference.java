package dev.nitid.testdata;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

/**
 * Reads the reference data bundled under {@code dev/nitid/testdata/reference/}: values computed with
 * external libraries (scipy, scikit-image, astropy, photutils, fitsverify) by the committed
 * {@code gen_*.py} scripts beside them, whose README names every source and version.
 */
public final class Reference {
    private static final String BUNDLED_ROOT = "/dev/nitid/testdata/";
    private static final String ROOT = BUNDLED_ROOT + "reference/";

    private Reference() {
    }

    /**
     * Opens a reference file.
     *
     * @param path path below the reference folder, e.g. {@code "golden/rl_input.csv"}
     * @return the stream (caller closes)
     */
    public static InputStream open(String path) {
        InputStream in = Reference.class.getResourceAsStream(ROOT + path);
        if (in == null) {
            throw new IllegalArgumentException("no reference file " + path + " under " + ROOT);
        }
        return in;
    }

    /**
     * Opens a file bundled elsewhere under {@code dev/nitid/testdata/} ({@code convolution/}, {@code hostile/},
     * {@code psf/}, {@code stars/}). Tests in other modules read through this class rather than their own
     * {@code Class.getResourceAsStream}: on the module path a class finds only its own module's resources,
     * and this class lives in the module that holds the files.
     *
     * @param path path below {@code dev/nitid/testdata/}, e.g. {@code "psf/moffat2d_astropy.csv"}
     * @return the stream (caller closes)
     * @throws IllegalArgumentException if there is no such file
     */
    public static InputStream openBundled(String path) {
        InputStream in = Reference.class.getResourceAsStream(BUNDLED_ROOT + path);
        if (in == null) {
            throw new IllegalArgumentException("no bundled test file " + path + " under " + BUNDLED_ROOT);
        }
        return in;
    }

    /**
     * @param path path below {@code dev/nitid/testdata/}
     * @return the bytes of a bundled file (see {@link #openBundled})
     */
    public static byte[] bundledBytes(String path) {
        try (InputStream in = openBundled(path)) {
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** @return the bytes of a reference file */
    public static byte[] bytes(String path) {
        try (InputStream in = open(path)) {
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** @return the lines of a reference text file */
    public static List<String> lines(String path) {
        String text = new String(bytes(path), StandardCharsets.UTF_8);
        List<String> out = new ArrayList<>();
        for (String line : text.split("\r?\n")) {
            if (!line.isBlank()) {
                out.add(line);
            }
        }
        return out;
    }

    /**
     * Reads a headerless numeric CSV (one image row per line) as a row-major matrix.
     *
     * @param path path below the reference folder
     * @return rows of values
     */
    public static double[][] matrix(String path) {
        List<String> lines = lines(path);
        double[][] m = new double[lines.size()][];
        for (int r = 0; r < m.length; r++) {
            String[] parts = lines.get(r).split(",");
            m[r] = new double[parts.length];
            for (int c = 0; c < parts.length; c++) {
                m[r][c] = Double.parseDouble(parts[c].trim());
            }
        }
        return m;
    }
}
