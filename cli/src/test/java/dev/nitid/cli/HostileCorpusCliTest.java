package dev.nitid.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Every hostile-corpus file ({@code testdata/scripts/gen_fits_hostile.py}) through {@code nitid info}: the
 * manifest's exit code, exactly one stderr line {@code nitid: FILE: what is wrong (what to do)} and nothing on
 * stdout for broken files, no file created, and the input unchanged (SHA-256 before and after).
 */
class HostileCorpusCliTest {
    private static final String ROOT = "/dev/nitid/testdata/hostile/";

    record Entry(String file, String expect, int exit, String sha256) {
        @Override
        public String toString() {
            return file;
        }
    }

    static Stream<Entry> entries() throws IOException {
        List<Entry> out = new ArrayList<>();
        try (InputStream in = HostileCorpusCliTest.class.getResourceAsStream(ROOT + "manifest.csv")) {
            for (String line : new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\n")) {
                if (line.isBlank() || line.startsWith("#") || line.startsWith("file,")) {
                    continue;
                }
                String[] f = line.split(",", 8);
                out.add(new Entry(f[0], f[1], Integer.parseInt(f[2]), f[6]));
            }
        }
        return out.stream();
    }

    @TempDir
    Path dir;

    private static String sha256(Path p) throws Exception {
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(p)));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("entries")
    void infoRefusesCleanly(Entry e) throws Exception {
        Path f = dir.resolve(e.file());
        try (InputStream in = HostileCorpusCliTest.class.getResourceAsStream(ROOT + e.file())) {
            Files.write(f, in.readAllBytes());
        }
        assertEquals(e.sha256(), sha256(f));
        CliRun r = CliRun.of("info", f.toString());
        assertEquals(e.exit(), r.exit(), r.err());
        if (e.exit() != 0) {
            assertEquals(1, r.errLines().size(), "stderr must be one line:\n" + r.err());
            String line = r.errLines().get(0);
            assertTrue(line.startsWith("nitid: " + f + ": "), line);
            assertTrue(line.endsWith(")"), "no '(what to do)': " + line);
            assertEquals("", r.out());
        } else {
            assertEquals("", r.err());
        }
        try (Stream<Path> s = Files.list(dir)) {
            assertEquals(List.of(f), s.toList(), "a file was created");
        }
        assertEquals(e.sha256(), sha256(f), "input changed");
    }

    /**
     * The same files as the input (and as the PSF) of {@code nitid sharpen}, which writes an output: the
     * manifest's exit code, one stderr line naming the hostile file, no output and no temporary file left,
     * inputs unchanged.
     */
    @ParameterizedTest(name = "{0}")
    @MethodSource("entries")
    void sharpenRefusesCleanlyAndWritesNothing(Entry e) throws Exception {
        org.junit.jupiter.api.Assumptions.assumeTrue(e.exit() != 0, "readable file: sharpening it is not an error");
        Path f = dir.resolve(e.file());
        try (InputStream in = HostileCorpusCliTest.class.getResourceAsStream(ROOT + e.file())) {
            Files.write(f, in.readAllBytes());
        }
        dev.nitid.image.Image psf = dev.nitid.image.Image.create(5, 5);
        for (int y = 0; y < 5; y++) {
            for (int x = 0; x < 5; x++) {
                psf.set(x, y, (float) Math.exp(-((x - 2) * (x - 2) + (y - 2) * (y - 2)) / 2.0));
            }
        }
        Path psfFile = dir.resolve("psf.fits");
        dev.nitid.fits.FitsWriter.write(psfFile, psf, dev.nitid.fits.FitsHeader.empty(),
                dev.nitid.fits.WriteOptions.defaults());
        Path good = dir.resolve("good.fits");
        dev.nitid.image.Image img = dev.nitid.image.Image.create(16, 16);
        img.fill(10f);
        dev.nitid.fits.FitsWriter.write(good, img, dev.nitid.fits.FitsHeader.empty(),
                dev.nitid.fits.WriteOptions.defaults());
        Path out = dir.resolve("out.fits");
        List<String[]> runs = List.of(
                new String[] {"sharpen", f.toString(), "--psf", psfFile.toString(), "-o", out.toString()},
                new String[] {"sharpen", good.toString(), "--psf", f.toString(), "-o", out.toString()});
        for (String[] args : runs) {
            CliRun r = CliRun.of(args);
            assertEquals(e.exit(), r.exit(), r.err());
            assertEquals(1, r.errLines().size(), "stderr must be one line:\n" + r.err());
            assertTrue(r.errLines().get(0).startsWith("nitid: " + f + ": "), r.errLines().get(0));
            try (Stream<Path> s = Files.list(dir)) {
                assertEquals(List.of(f, good, psfFile).stream().sorted().toList(), s.sorted().toList(),
                        "an output or temporary file was left");
            }
            assertEquals(e.sha256(), sha256(f), "input changed");
        }
    }
}
