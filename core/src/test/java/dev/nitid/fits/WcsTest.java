package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * Pixel scale from the WCS linear transformation (Greisen &amp; Calabretta 2002, A&amp;A 395, 1061, §2.1:
 * CDi_j, or CDELTi × PCi_j) and the unit rules (degrees for celestial axes, Calabretta &amp; Greisen 2002).
 */
class WcsTest {
    @Test
    void cdMatrixOfACelestialPair() {
        FitsHeader h = FitsHeader.empty().with("CTYPE1", "GLON-CAR", null).with("CTYPE2", "GLAT-CAR", null)
                .with("CD1_1", -1e-3, null).with("CD2_2", 1e-3, null);
        assertEquals(3.6, Wcs.pixelScaleArcsec(h).getAsDouble(), 1e-12);
    }

    @Test
    void explicitDegreesWithoutCtype() {
        FitsHeader h = FitsHeader.empty().with("CDELT1", -2e-4, null).with("CDELT2", 2e-4, null)
                .with("CUNIT1", "deg", null).with("CUNIT2", "deg", null);
        assertEquals(0.72, Wcs.pixelScaleArcsec(h).getAsDouble(), 1e-12);
    }

    @Test
    void nonAngularAxesHaveNoScale() {
        // Like the HST test file shipped with astropy (CTYPE 'UNITLESS'/'LINE' with a CD matrix).
        FitsHeader h = FitsHeader.empty().with("CTYPE1", "UNITLESS", null).with("CTYPE2", "LINE", null)
                .with("CD1_1", 2.3e-5, null).with("CD2_2", -2.3e-5, null);
        assertTrue(Wcs.pixelScaleArcsec(h).isEmpty());
        FitsHeader arcsec = FitsHeader.empty().with("CTYPE1", "RA---TAN", null).with("CTYPE2", "DEC--TAN", null)
                .with("CDELT1", 1.0, null).with("CDELT2", 1.0, null).with("CUNIT1", "arcsec", null);
        assertTrue(Wcs.pixelScaleArcsec(arcsec).isEmpty(), "units other than deg are not converted");
        assertTrue(Wcs.pixelScaleArcsec(FitsHeader.empty()).isEmpty());
    }
}
