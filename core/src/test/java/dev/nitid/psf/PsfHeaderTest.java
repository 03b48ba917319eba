package dev.nitid.psf;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.Card;
import dev.nitid.fits.FitsHeader;
import dev.nitid.image.Image;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The FITS cards that describe a rendered PSF ({@link PsfHeader}), checked against closed forms. */
class PsfHeaderTest {
    /**
     * A pixel-integrated Gaussian is the Gaussian convolved with the 1-px box, variance σ² + 1/12 per axis
     * (variance of a uniform distribution of width 1; common practice, no source); the box makes it slightly
     * non-Gaussian, which at σ ≈ 3.4 px changes the radii by well under 0.5 % (estimate, project choice).
     */
    static final double RADIUS_REL = 0.005;

    @Test
    void gaussianRadiiFollowTheRayleighDistribution() {
        double fwhm = 8;
        GaussianPsf g = GaussianPsf.ofFwhm(fwhm);
        int size = 61;
        int os = 5;
        Image img = g.render(size, os, 0, 0);
        FitsHeader h = PsfHeader.of(g, PsfFigures.of(img, g), size, os, "test");
        // Encircled energy of a circular Gaussian: 1 − exp(−r²/2σ²) (the Rayleigh distribution's CDF, from
        // memory), so R50 = σ√(2 ln 2) and R80 = σ√(2 ln 5), σ² = (FWHM/2√(2 ln 2))² + 1/12 after pixel integration.
        double sigma = Math.sqrt(Math.pow(fwhm / (2 * Math.sqrt(2 * Math.log(2))), 2) + 1.0 / 12);
        assertEquals(sigma * Math.sqrt(2 * Math.log(2)), h.getDouble("R50").orElseThrow(),
                RADIUS_REL * sigma, "R50");
        assertEquals(sigma * Math.sqrt(2 * Math.log(5)), h.getDouble("R80").orElseThrow(),
                RADIUS_REL * 2 * sigma, "R80");
        assertEquals(61, h.getDouble("PSFSIZE").orElseThrow(), 0);
        assertEquals(5, h.getDouble("SUBPIXEL").orElseThrow(), 0);
        assertEquals(1.0, h.getDouble("PSFSUM").orElseThrow(), 0);
        // every model parameter is a card with the parameter's value
        for (PsfParameter p : g.parameters()) {
            Card c = h.card(p.key()).orElseThrow(() -> new AssertionError("missing " + p.key()));
            if (p.value() instanceof Double d) {
                assertEquals(d, h.getDouble(p.key()).orElseThrow(), 0, p.key());
            } else if (p.value() instanceof String s) {
                assertEquals(s, h.getString(p.key()).orElseThrow(), p.key());
            }
            assertEquals(p.comment(), c.comment(), p.key());
        }
        // no optics: no plate scale, Strehl or sampling cards
        for (String key : List.of("PLTSCALE", "STREHL", "NYQRATIO", "UNDERSMP", "FWHMAS")) {
            assertTrue(h.card(key).isEmpty(), key);
        }
        List<Card> history = h.cards().stream().filter(c -> c.key().equals("HISTORY")).toList();
        assertEquals("test: " + g.description(), history.get(0).comment());
        assertTrue(history.get(1).comment().startsWith("PSF rendered on 61x61 px, 5x5 sub-pixels"));
    }

    @Test
    void pupilCardsFollowTheOptics() {
        // Invented 200 mm f/5 telescope, 3.76 µm pixels, 550 nm, 0.05 waves RMS of defocus.
        PupilPsf p = PupilPsf.of(200, 1000, 3.76, Spectrum.monochromatic(550)).withZernike(Zernike.single(4, 0.05));
        int size = 25;
        int os = 3;
        Image img = p.render(size, os, 0, 0);
        FitsHeader h = PsfHeader.of(p, PsfFigures.of(img, p), size, os, "nitid test psf");
        // 206.264806 × p/f (reference README §4: 3.76 µm at 1000 mm → 0.775556″/px)
        assertEquals(0.775556, h.getDouble("PLTSCALE").orElseThrow(), 1e-6);
        // Nyquist pixel λf/(2D) = 0.55 µm × 1000 / 400 = 1.375 µm (Nyquist: two samples per λ/D cycle of the
        // OTF cut-off D/λ, common practice): 3.76 / 1.375 = 2.7345, under-sampled
        assertEquals(3.76 / 1.375, h.getDouble("NYQRATIO").orElseThrow(), 1e-9);
        assertEquals("T", h.getString("UNDERSMP").orElseThrow());
        // Maréchal: S ≈ exp(−(2π·W_rms)²) for small aberrations (Born & Wolf, Principles of Optics, §9.1;
        // Mahajan 1983, JOSA 73, 860): 0.906 at 0.05 waves; 0.5 % covers the approximation at this level
        // (from memory)
        assertEquals(Math.exp(-Math.pow(2 * Math.PI * 0.05, 2)), h.getDouble("STREHL").orElseThrow(), 0.005);
        assertTrue(h.getDouble("FWHMAS").isPresent(), "FWHM in arcsec when the plate scale is known");
        assertEquals(h.getDouble("FWHM").orElseThrow() * 0.775556, h.getDouble("FWHMAS").orElseThrow(), 1e-5);
    }

    @Test
    void producerIsRequired() {
        GaussianPsf g = GaussianPsf.ofFwhm(3);
        Image img = g.render(15);
        assertThrows(IllegalArgumentException.class, () -> PsfHeader.of(g, PsfFigures.of(img, g), 15, 5, null));
    }
}
