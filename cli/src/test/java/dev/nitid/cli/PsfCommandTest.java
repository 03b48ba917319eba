package dev.nitid.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import dev.nitid.psf.PsfFigures;
import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code nitid psf} end to end: files written, header contents, and the one-line errors with exit codes. */
class PsfCommandTest {
    /**
     * Strehl of the written header against the exact annular-defocus Strehl averaged over the band: 1e-3,
     * the bound core's PupilIdentitiesTest holds the pupil's defocus Strehl to (pupil sampling). The formula
     * ignores the '+' spider; on a 1024-sample numpy 1.24.2 pupil the 2 mm vanes move the band Strehl by
     * 1.5e-4 ({@code testdata/scripts/derive_band_defocus_strehl.py}). Measured 1.4e-4. (Was "between 0.85
     * and 1".)
     */
    static final double STREHL_ATOL = 1e-3;
    @TempDir
    Path dir;

    static CliRun run(String... args) {
        System.setProperty("java.awt.headless", "true");
        return CliRun.run(args);
    }

    @Test
    void gaussianWritesNormalisedFitsWithFigures() throws Exception {
        Path f = dir.resolve("g.fits");
        CliRun r = run("psf", "--model", "gaussian", "--fwhm", "3", "--ellipticity", "0.2", "--angle", "30",
                "--size", "31", "-o", f.toString());
        assertEquals(0, r.code(), r.err());
        FitsImage fi = FitsReader.read(f);
        assertEquals(31, fi.image().width());
        assertEquals(31, fi.image().height());
        assertEquals(1, fi.image().stats(0).sum(), 1e-6, "sum 1");
        assertEquals("gaussian", fi.header().getString("PSFMODEL").orElseThrow());
        assertEquals(3, fi.header().getDouble("PSFFWHMA").orElseThrow(), 1e-12);
        assertEquals(2.4, fi.header().getDouble("PSFFWHMB").orElseThrow(), 1e-12);
        assertEquals(30, fi.header().getDouble("PSFANGLE").orElseThrow(), 1e-12);
        assertEquals(5, fi.header().getDouble("SUBPIXEL").orElseThrow(), 0);
        PsfFigures fig = PsfFigures.of(fi.image());
        assertEquals(fig.fwhmPx(), fi.header().getDouble("FWHM").orElseThrow(), 1e-6, "FWHM card = figure of the file");
        String history = fi.header().cards().stream().filter(c -> "HISTORY".equals(c.key()))
                .map(c -> String.valueOf(c.comment())).reduce("", String::concat);
        assertTrue(history.contains("--ellipticity"), "command line in HISTORY: " + history);
        assertTrue(r.out().contains("FWHM"), r.out());
    }

    @Test
    void moffatWithPreview() throws Exception {
        Path f = dir.resolve("m.fits");
        Path png = dir.resolve("m.png");
        CliRun r = run("psf", "--model", "moffat", "--fwhm", "3.2", "--beta", "3", "-o", f.toString(),
                "--preview", png.toString());
        assertEquals(0, r.code(), r.err());
        FitsImage fi = FitsReader.read(f);
        assertEquals(3.0, fi.header().getDouble("PSFBETA").orElseThrow(), 0);
        assertEquals(1, fi.image().width() % 2, "automatic size is odd");
        BufferedImage pic = ImageIO.read(png.toFile());
        assertTrue(pic.getWidth() > 600 && pic.getHeight() > 400, "preview drawn: " + pic.getWidth() + "x" + pic.getHeight());
    }

    /** Plate scale in the header: 206.264806·p/f (reference README §4): 3.76 µm at 1000 mm → 0.775556″/px. */
    @Test
    void airyBandRecordsOpticsAndSampling() throws Exception {
        Path f = dir.resolve("a.fits");
        CliRun r = run("psf", "--model", "airy", "--aperture", "200", "--obstruction", "0.33", "--vanes", "4",
                "--vane-width", "2", "--focal-length", "1000", "--pixel-size", "3.76", "--band", "500-600",
                "--zernike", "4=0.05", "--jitter", "0.3", "--size", "33", "--oversample", "3", "-o", f.toString());
        assertEquals(0, r.code(), r.err());
        FitsImage fi = FitsReader.read(f);
        assertEquals(0.775555671489, fi.header().getDouble("PLTSCALE").orElseThrow(), 1e-9);
        assertEquals(5, fi.header().getDouble("NLAMBDA").orElseThrow(), 0, "5 wavelengths over 100 nm");
        assertEquals(0.05, fi.header().getDouble("ZERN4").orElseThrow(), 0);
        assertEquals(0.3, fi.header().getDouble("JITTER").orElseThrow(), 0);
        // Defocus Z4 = √3(2ρ² − 1) (Noll 1976, Table 1) of σ waves is linear in u = ρ², which is uniform over
        // the annulus ε² ≤ u ≤ 1, so the phase is uniform over a span 4√3·πσ(1 − ε²) and the Strehl
        // |⟨e^{iφ}⟩|² is exactly sinc²(2√3·πσ(1 − ε²)) (derived here, as in core's PupilIdentitiesTest; the
        // Maréchal approximation exp(−(2πσ_rms)²) of Born &amp; Wolf §9.3 agrees to second order). The band
        // is sampled at 5 bin centres 510…590 nm, the wavefront is given in waves at the centre 550 nm, so
        // σ(λ) = 0.05·550/λ, and each wavelength weighs as its unaberrated peak, ∝ 1/λ² (PupilPsf#strehl).
        double num = 0;
        double den = 0;
        for (double lambda = 510; lambda <= 590; lambda += 20) {
            double x = 2 * Math.sqrt(3) * Math.PI * (0.05 * 550 / lambda) * (1 - 0.33 * 0.33);
            num += Math.pow(Math.sin(x) / x, 2) / (lambda * lambda);
            den += 1 / (lambda * lambda);
        }
        double strehl = fi.header().getDouble("STREHL").orElseThrow();
        assertEquals(num / den, strehl, STREHL_ATOL, "defocus 0.05 waves on the ε = 0.33 annulus over 500–600 nm");
        // D = 200 mm, f = 1000 mm at 500 nm: Nyquist pixel 1.25 µm, so 3.76 µm under-samples (ratio ≈ 3)
        assertTrue(fi.header().getString("UNDERSMP").orElseThrow().startsWith("T"));
        assertTrue(r.err().contains("Nyquist"), "warning printed: " + r.err());
    }

    @Test
    void mistakesGiveOneLineAndExitCode() throws Exception {
        Path f = dir.resolve("x.fits");
        CliRun noFwhm = run("psf", "--model", "gaussian", "-o", f.toString());
        assertEquals(ExitCode.USAGE, noFwhm.code());
        assertTrue(noFwhm.err().startsWith("nitid: ") && noFwhm.err().contains("--fwhm"), noFwhm.err());
        assertEquals(1, noFwhm.err().strip().lines().count(), "one line: " + noFwhm.err());

        CliRun even = run("psf", "--model", "moffat", "--fwhm", "3", "--size", "20", "-o", f.toString());
        assertEquals(ExitCode.USAGE, even.code());
        assertTrue(even.err().contains("odd"), even.err());

        CliRun zern = run("psf", "--model", "airy", "--aperture", "100", "--focal-length", "500", "--pixel-size", "3",
                "--zernike", "4:0.1", "-o", f.toString());
        assertEquals(ExitCode.USAGE, zern.code());
        assertTrue(zern.err().contains("INDEX=WAVES"), zern.err());

        CliRun seeing = run("psf", "--model", "gaussian", "--fwhm", "2", "--seeing", "2", "-o", f.toString());
        assertEquals(ExitCode.USAGE, seeing.code());
        assertTrue(seeing.err().contains("--focal-length"), seeing.err());

        CliRun ok = run("psf", "--model", "gaussian", "--fwhm", "2", "-o", f.toString());
        assertEquals(0, ok.code(), ok.err());
        CliRun again = run("psf", "--model", "gaussian", "--fwhm", "2", "-o", f.toString());
        assertEquals(ExitCode.CANNOT_CREATE, again.code(), again.err());
        CliRun over = run("psf", "--model", "gaussian", "--fwhm", "2", "-o", f.toString(), "--overwrite");
        assertEquals(0, over.code(), over.err());
        assertTrue(Files.size(f) > 0);
    }

    @Test
    void optionRulesAndAutomaticSize() throws Exception {
        Path f = dir.resolve("s.fits");
        // automatic side: ±3 FWHM for a Gaussian (docs/psf.md), so FWHM 3 → 2·9 + 1 = 19
        CliRun g = run("psf", "--model", "gaussian", "--fwhm", "3", "-o", f.toString());
        assertEquals(0, g.code(), g.err());
        assertEquals(19, FitsReader.read(f).image().width());
        CliRun noll = run("psf", "--model", "airy", "--aperture", "100", "--focal-length", "500", "--pixel-size", "3",
                "--zernike", "12=0.1", "-o", dir.resolve("n.fits").toString());
        assertEquals(ExitCode.USAGE, noll.code());
        assertTrue(noll.err().contains("Noll"), noll.err());
        CliRun vanes = run("psf", "--model", "airy", "--aperture", "100", "--focal-length", "500", "--pixel-size", "3",
                "--vanes", "3", "-o", dir.resolve("v.fits").toString());
        assertEquals(ExitCode.USAGE, vanes.code());
        assertTrue(vanes.err().contains("--vane-width"), vanes.err());
        CliRun both = run("psf", "--model", "airy", "--aperture", "100", "--focal-length", "500", "--pixel-size", "3",
                "--wavelength", "600", "--band", "500-600", "-o", dir.resolve("b.fits").toString());
        assertEquals(ExitCode.USAGE, both.code());
        CliRun band = run("psf", "--model", "airy", "--aperture", "100", "--focal-length", "500", "--pixel-size", "3",
                "--band", "400-700", "--size", "15", "-o", dir.resolve("band.fits").toString());
        assertEquals(0, band.code(), band.err());
        FitsImage fi = FitsReader.read(dir.resolve("band.fits"));
        assertEquals(400, fi.header().getDouble("BANDLO").orElseThrow(), 1e-9);
        assertEquals(700, fi.header().getDouble("BANDHI").orElseThrow(), 1e-9);
        assertEquals(15, fi.header().getDouble("NLAMBDA").orElseThrow(), 0, "one wavelength per 20 nm");
    }

    /**
     * The written file passes fitsverify 4.20 (HEASARC's FITS checker) and astropy 5.2.1 reads the same
     * pixels and cards; skipped where those Debian packages are not installed.
     */
    @Test
    void outsideToolsAcceptTheFile() throws Exception {
        Path f = dir.resolve("ext.fits");
        CliRun r = run("psf", "--model", "moffat", "--fwhm", "2.5", "--beta", "3", "--size", "25", "-o", f.toString());
        assertEquals(0, r.code(), r.err());
        Path fv = Path.of("/usr/bin/fitsverify");
        org.junit.jupiter.api.Assumptions.assumeTrue(Files.isExecutable(fv), "fitsverify not installed");
        Process p = new ProcessBuilder(fv.toString(), "-q", "-e", f.toString()).redirectErrorStream(true).start();
        String text = new String(p.getInputStream().readAllBytes(), java.nio.charset.StandardCharsets.UTF_8);
        assertEquals(0, p.waitFor(), text);
        assertTrue(text.contains("OK"), text);
        Path py = Path.of("/usr/bin/python3");
        org.junit.jupiter.api.Assumptions.assumeTrue(Files.isExecutable(py), "python3 not installed");
        Process q = new ProcessBuilder(py.toString(), "-c", "import sys\n"
                + "try:\n from astropy.io import fits\nexcept ImportError:\n print('NOASTROPY'); sys.exit(0)\n"
                + "h = fits.open(sys.argv[1])[0]\n"
                + "print(repr(float(h.data.astype('float64').sum())), h.data.shape[0], h.header['PSFMODEL'], "
                + "repr(float(h.header['PSFBETA'])))", f.toString()).redirectErrorStream(true).start();
        String out = new String(q.getInputStream().readAllBytes(), java.nio.charset.StandardCharsets.UTF_8).trim();
        assertEquals(0, q.waitFor(), out);
        org.junit.jupiter.api.Assumptions.assumeFalse(out.contains("NOASTROPY"), "astropy not installed");
        String[] parts = out.split("\\s+");
        assertEquals(1.0, Double.parseDouble(parts[0]), 1e-6, "astropy sum: " + out);
        assertEquals("25", parts[1]);
        assertEquals("moffat", parts[2]);
        assertEquals(3.0, Double.parseDouble(parts[3]), 0);
    }
}
