package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.testdata.Reference;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Runs every file of the hostile corpus ({@code testdata/scripts/gen_fits_hostile.py}, built byte by byte
 * against the rules of the FITS Standard 4.0) through the reader: the expected kind, HDU, keyword and phrase
 * for broken files, the masked count for odd-but-readable ones, and the input unchanged (SHA-256 before and
 * after equals the manifest's).
 */
class HostileCorpusTest {
    /** The corpus folder below {@code dev/nitid/testdata/}. */
    static final String FOLDER = "hostile/";

    /** One manifest row. */
    record Entry(String file, String expect, int exit, int hdu, String keyword, String contains, String sha256,
                 String what) {
        @Override
        public String toString() {
            return file + " (" + what + ")";
        }
    }

    static List<Entry> manifest() {
        List<Entry> out = new ArrayList<>();
        for (String line : new String(bytes("manifest.csv"), StandardCharsets.UTF_8).split("\n")) {
            if (line.isBlank() || line.startsWith("#") || line.startsWith("file,")) {
                continue;
            }
            String[] f = line.split(",", 8);
            out.add(new Entry(f[0], f[1], Integer.parseInt(f[2]), Integer.parseInt(f[3]),
                    f[4].isEmpty() ? null : f[4], f[5], f[6], f[7]));
        }
        return out;
    }

    /** A corpus file, read through the testdata module so it also works on the module path. */
    static byte[] bytes(String name) {
        return Reference.bundledBytes(FOLDER + name);
    }

    static String sha256(Path p) throws Exception {
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(p)));
    }

    static Stream<Entry> entries() {
        return manifest().stream();
    }

    @TempDir
    Path tmp;

    @Test
    void corpusHasAtLeastTwentyBrokenFiles() {
        // The issue asks for at least 20 hostile files.
        long broken = manifest().stream().filter(e -> !e.expect().equals("OK")).count();
        assertTrue(broken >= 20, "only " + broken + " broken files in the corpus");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("entries")
    void readerGivesTheExpectedOutcome(Entry e) throws Exception {
        Path file = tmp.resolve(e.file());
        Files.write(file, bytes(e.file()));
        assertEquals(e.sha256(), sha256(file), "corpus file differs from the manifest; rerun the generator");
        if (e.expect().equals("OK")) {
            FitsImage fi = FitsReader.read(file);
            assertEquals(Long.parseLong(e.contains()), fi.maskedPixels(), "masked pixels");
        } else {
            FitsException ex = assertThrows(FitsException.class, () -> FitsReader.read(file));
            assertEquals(FitsException.Kind.valueOf(e.expect()), ex.kind(), ex.getMessage());
            assertEquals(e.hdu(), ex.hdu(), "HDU named: " + ex.getMessage());
            assertEquals(e.keyword(), ex.keyword(), "keyword named: " + ex.getMessage());
            assertTrue(ex.getMessage().contains(e.contains()), "message lacks '" + e.contains() + "': "
                    + ex.getMessage());
            assertEquals(file, ex.file());
            assertOneSentenceWithFix(ex.getMessage());
        }
        assertEquals(e.sha256(), sha256(file), "the reader changed its input");
        assertArrayEquals(bytes(e.file()), Files.readAllBytes(file));
    }

    /** The house rule: one line, "what is wrong (what to do)". */
    static void assertOneSentenceWithFix(String message) {
        assertTrue(!message.contains("\n"), "message spans lines: " + message);
        assertTrue(message.trim().endsWith(")"), "message does not end with '(what to do)': " + message);
    }
}
