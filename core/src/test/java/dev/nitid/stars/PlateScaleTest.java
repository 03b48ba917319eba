package dev.nitid.stars;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.FitsHeader;
import org.junit.jupiter.api.Test;

/** Worked examples from the reference README §4 (astropy.units, constants.csv) and the FITS WCS paper. */
class PlateScaleTest {
    /** Closed forms: 1e-9 relative (reference README §4). */
    private static final double REL = 1e-9;

    @Test
    void opticsWorkedExamples() {
        // reference README §4 [LIB]: 3.76 µm at 1000 mm → 0.775556″/px; 5.4 µm at 2000 mm → 0.556915″/px;
        // 9 µm at 530 mm → 3.502610″/px; 2.4 µm at 400 mm → 1.237589″/px (6 significant digits given).
        assertEquals(0.775556, PlateScale.fromOptics(3.76, 1000, 1, "t").arcsecPerPixel(), 1e-6);
        assertEquals(0.556915, PlateScale.fromOptics(5.4, 2000, 1, "t").arcsecPerPixel(), 1e-6);
        assertEquals(3.502610, PlateScale.fromOptics(9, 530, 1, "t").arcsecPerPixel(), 1e-6);
        assertEquals(1.237589, PlateScale.fromOptics(2.4, 400, 1, "t").arcsecPerPixel(), 1e-6);
        assertEquals(2 * 0.775556, PlateScale.fromOptics(3.76, 1000, 2, "t").arcsecPerPixel(), 2e-6);
    }

    @Test
    void headerOrderWcsThenFocalLength() {
        // A CD matrix scales angles only on a celestial axis pair (Calabretta & Greisen 2002, §2).
        FitsHeader wcs = FitsHeader.empty().with("CTYPE1", "RA---TAN", "").with("CTYPE2", "DEC--TAN", "")
                .with("CD1_1", -2.0 / 3600, "").with("CD1_2", 0.0, "")
                .with("CD2_1", 0.0, "").with("CD2_2", 2.0 / 3600, "").with("FOCALLEN", 1000.0, "")
                .with("XPIXSZ", 3.76, "");
        PlateScale s = PlateScale.fromHeader(wcs).orElseThrow();
        assertEquals(2.0, s.arcsecPerPixel(), REL * 2, "sqrt|det CD| × 3600 (Greisen & Calabretta 2002)");
        assertTrue(s.source().startsWith("WCS"));
        FitsHeader cap = FitsHeader.empty().with("FOCALLEN", 1000.0, "").with("XPIXSZ", 3.76, "")
                .with("YPIXSZ", 3.76, "");
        assertEquals(0.775556, PlateScale.fromHeader(cap).orElseThrow().arcsecPerPixel(), 1e-6);
        FitsHeader raw = FitsHeader.empty().with("FOCALLEN", 1000.0, "").with("PIXSIZE1", 3.76, "")
                .with("XBINNING", 2L, "");
        assertEquals(2 * 0.775556, PlateScale.fromHeader(raw).orElseThrow().arcsecPerPixel(), 2e-6);
        assertTrue(PlateScale.fromHeader(FitsHeader.empty().with("FOCALLEN", 1000.0, "")).isEmpty());
        assertThrows(IllegalArgumentException.class, () -> PlateScale.fromOptics(0, 1000, 1, "t"));
    }
}
