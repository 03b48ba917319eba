package dev.nitid.cli;

import static dev.nitid.cli.CliRun.run;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.WriteOptions;
import dev.nitid.image.Image;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.SplittableRandom;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code nitid sharpen} on an invented star field written to FITS. */
class SharpenCommandTest {
    @TempDir
    Path dir;
    Path in;
    Path psf;



    private static Image gaussian(int n, double sigma) {
        Image k = Image.create(n, n);
        for (int y = 0; y < n; y++) {
            for (int x = 0; x < n; x++) {
                k.set(x, y, (float) Math.exp(-((x - n / 2) * (x - n / 2) + (y - n / 2) * (y - n / 2)) / (2 * sigma * sigma)));
            }
        }
        return k;
    }

    @BeforeEach
    void files() throws Exception {
        // an invented field: sky 100, three stars blurred by a Gaussian of σ 1.5 px, Gaussian noise σ 10
        int n = 64;
        Image k = gaussian(11, 1.5);
        double ks = k.stats(0).sum();
        Image img = Image.create(n, n);
        SplittableRandom rnd = new SplittableRandom(3);
        int[][] stars = {{20, 20}, {40, 45}, {12, 50}};
        for (int y = 0; y < n; y++) {
            for (int x = 0; x < n; x++) {
                double v = 100;
                for (int[] s : stars) {
                    double r2 = (x - s[0]) * (x - s[0]) + (y - s[1]) * (y - s[1]);
                    v += 20000 / ks * Math.exp(-r2 / (2 * 1.5 * 1.5));
                }
                img.set(x, y, (float) (v + 10 * rnd.nextGaussian()));
            }
        }
        in = dir.resolve("field.fits");
        psf = dir.resolve("psf.fits");
        FitsWriter.write(in, img, FitsHeader.empty().with("OBJECT", "invented field", "made-up scene")
                .with("INSTRUME", "Example Camera 1", "fictional instrument"), WriteOptions.defaults());
        FitsWriter.write(psf, k, FitsHeader.empty(), WriteOptions.defaults());
    }

    @Test
    void sharpensWritesHeaderCardsAndKeepsTheInputHeader() throws Exception {
        Path out = dir.resolve("out.fits");
        CliRun r = run("sharpen", in.toString(), "--psf", psf.toString(), "-o", out.toString(), "--threads", "1");
        assertEquals(ExitCode.OK, r.code(), r.err());
        FitsImage o = FitsReader.read(out);
        assertEquals("invented field", o.header().getString("OBJECT").orElse(""));
        assertEquals("ACCELERATED_TV_RL", o.header().getString("NTDMETH").orElse(""));
        assertEquals("RING_FLOOR", o.header().getString("NTDGUARD").orElse(""));
        assertTrue(o.header().cards().stream().anyMatch(c -> "HISTORY".equals(c.key())), "HISTORY card");
        // the stars got sharper: the peak rose
        FitsImage i = FitsReader.read(in);
        assertTrue(o.image().get(20, 20) > 1.3 * i.image().get(20, 20),
                "peak " + o.image().get(20, 20) + " vs " + i.image().get(20, 20));
        assertTrue(r.out().contains("wrote"), r.out());
    }

    @Test
    void iterationsRunsExactlyThatManyAndWienerIsOnePass() throws Exception {
        Path out = dir.resolve("o3.fits");
        assertEquals(ExitCode.OK, run("sharpen", in.toString(), "--psf", psf.toString(), "-o", out.toString(),
                "--iterations", "3").code());
        assertEquals(3.0, FitsReader.read(out).header().getDouble("NTDITER").orElse(-1));
        assertEquals("FIXED_COUNT_REACHED", FitsReader.read(out).header().getString("NTDSTOP").orElse(""));
        Path w = dir.resolve("w.fits");
        CliRun r = run("sharpen", in.toString(), "--psf", psf.toString(), "-o", w.toString(), "--method", "wiener");
        assertEquals(ExitCode.OK, r.code(), r.err());
        assertEquals("WIENER", FitsReader.read(w).header().getString("NTDMETH").orElse(""));
    }

    @Test
    void mistakesGiveOneLineAndTheDocumentedExitCode() throws Exception {
        Path out = dir.resolve("x.fits");
        CliRun missing = run("sharpen", in.toString(), "--psf", dir.resolve("nope.fits").toString(), "-o", out.toString());
        assertEquals(ExitCode.NO_INPUT, missing.code());
        assertTrue(missing.err().startsWith("nitid: ") && missing.err().strip().lines().count() == 1, missing.err());
        Files.writeString(out, "occupied");
        CliRun exists = run("sharpen", in.toString(), "--psf", psf.toString(), "-o", out.toString());
        assertEquals(ExitCode.CANNOT_CREATE, exists.code(), exists.err());
        assertEquals(ExitCode.OK, run("sharpen", in.toString(), "--psf", psf.toString(), "-o", out.toString(),
                "--overwrite", "--iterations", "1").code());
        CliRun zero = run("sharpen", in.toString(), "--psf", psf.toString(), "-o", out.toString(), "--overwrite",
                "--iterations", "0");
        assertEquals(ExitCode.USAGE, zero.code());
        assertTrue(zero.err().contains("--iterations"), zero.err());
        CliRun self = run("sharpen", in.toString(), "--psf", psf.toString(), "-o", in.toString(), "--overwrite");
        assertEquals(ExitCode.CANNOT_CREATE, self.code(), "the input is never overwritten: " + self.err());
    }

    @Test
    void helpSaysDeconvolvedImagesAreNotForPhotometry() {
        CliRun r = run("sharpen", "--help");
        assertEquals(ExitCode.OK, r.code());
        assertTrue(r.out().contains("not for photometry"), r.out());
        assertTrue(r.out().contains("--iterations") && r.out().contains("--psf") && r.out().contains("--overwrite"));
    }
}
