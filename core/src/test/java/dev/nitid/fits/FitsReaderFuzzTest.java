package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Fuzz test of {@link FitsReader} with Jazzer (com.code-intelligence:jazzer-junit 0.30.0): any bytes, read as
 * a file, must give either an image or a {@link FitsException} with a one-line message ending in "(fix)".
 * Any other exception, an OutOfMemoryError or a hang is a finding.
 *
 * <p>Under plain {@code mvn verify} this runs once per file in
 * {@code src/test/resources/dev/nitid/fits/FitsReaderFuzzTestInputs/readAnyBytes/} (seeds: astropy golden
 * files, hostile corpus samples, and every past finding) as a regression test. To fuzz:
 * {@code JAZZER_FUZZ=1 mvn -o -pl core test -Dtest=FitsReaderFuzzTest -Djazzer.max_duration=5m}
 * (see docs/fits.md); new findings land in that folder and must be kept there.
 */
class FitsReaderFuzzTest {
    private static final Path FILE;

    static {
        try {
            Path dir = Files.createTempDirectory("nitid-fuzz");
            dir.toFile().deleteOnExit();
            FILE = dir.resolve("input.fits");
            FILE.toFile().deleteOnExit();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @FuzzTest(maxDuration = "5m")
    void readAnyBytes(byte[] data) throws IOException {
        Files.write(FILE, data);
        try {
            FitsImage fi = FitsReader.read(FILE);
            assertTrue(fi.image().width() >= 1 && fi.image().height() >= 1);
            assertTrue(fi.image().planes() >= 1 && fi.image().planes() <= FitsReader.MAX_PLANES);
            assertTrue(fi.maskedPixels() >= 0
                    && fi.maskedPixels() <= (long) fi.image().pixelCount() * fi.image().planes());
        } catch (FitsException e) {
            assertNotNull(e.kind());
            assertNotNull(e.getMessage());
            HostileCorpusTest.assertOneSentenceWithFix(e.getMessage());
        }
    }
}
