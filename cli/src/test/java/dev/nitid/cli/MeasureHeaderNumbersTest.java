package dev.nitid.cli;

import static dev.nitid.cli.CliRun.run;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.WriteOptions;
import dev.nitid.image.Image;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code nitid measure} and {@code nitid sharpen} on a header whose SATURATE or FOCALLEN is not a number
 * (FITS Standard 4.0 §4.2.3-4.2.4): one line naming the file and the card, exit 65 (data error), the option
 * that overrides the card, and (sharpen) nothing written.
 */
class MeasureHeaderNumbersTest {
    @TempDir
    Path dir;

    private Path frame(String name, FitsHeader h) throws Exception {
        Path f = dir.resolve(name);
        FitsWriter.write(f, Image.create(16, 16, 1), h, WriteOptions.defaults());
        return f;
    }

    @Test
    void malformedSaturateIsADataError() throws Exception {
        Path f = frame("sat.fits", FitsHeader.empty().with("SATURATE", "abc", null));
        CliRun r = run("measure", f.toString());
        assertEquals(ExitCode.DATA, r.exit(), r.err());
        assertEquals(1, r.errLines().size(), r.err());
        String line = r.errLines().get(0);
        assertTrue(line.startsWith("nitid: " + f + ": HDU 0: SATURATE is 'abc'"), line);
        assertTrue(line.endsWith("(correct or remove the card, or give --saturation)"), line);
    }

    @Test
    void malformedFocalLengthIsADataError() throws Exception {
        Path f = frame("focal.fits", FitsHeader.empty().with("FOCALLEN", "800 mm", null).with("XPIXSZ", 3.8, null));
        CliRun r = run("measure", f.toString());
        assertEquals(ExitCode.DATA, r.exit(), r.err());
        String line = r.errLines().get(0);
        assertTrue(line.startsWith("nitid: " + f + ": HDU 0: FOCALLEN is '800 mm'"), line);
        assertTrue(line.contains("--pixel-scale"), line);
    }

    @Test
    void sharpenStopsOnAMalformedSaturateBeforeRestoring() throws Exception {
        Path f = frame("sharp-sat.fits", FitsHeader.empty().with("SATURATE", "abc", null));
        Path psf = frame("psf.fits", FitsHeader.empty());
        Path out = dir.resolve("out.fits");
        CliRun r = run("sharpen", f.toString(), "--psf", psf.toString(), "-o", out.toString());
        assertEquals(ExitCode.DATA, r.exit(), r.err());
        assertEquals(1, r.errLines().size(), r.err());
        String line = r.errLines().get(0);
        assertTrue(line.startsWith("nitid: " + f + ": HDU 0: SATURATE is 'abc'"), line);
        assertTrue(line.endsWith("(correct or remove the card, or give --saturation)"), line);
        assertTrue(!java.nio.file.Files.exists(out), "nothing written");
    }

    @Test
    void sharpenStopsOnAMalformedFocalLength() throws Exception {
        Path f = frame("sharp-focal.fits", FitsHeader.empty().with("FOCALLEN", "800 mm", null).with("XPIXSZ", 3.8, null));
        Path psf = frame("psf2.fits", FitsHeader.empty());
        CliRun r = run("sharpen", f.toString(), "--psf", psf.toString(), "-o", dir.resolve("o2.fits").toString());
        assertEquals(ExitCode.DATA, r.exit(), r.err());
        assertTrue(r.errLines().get(0).contains("FOCALLEN is '800 mm'")
                && r.err().contains("give --focal-length with --pixel-size)"), r.err());
    }
}
