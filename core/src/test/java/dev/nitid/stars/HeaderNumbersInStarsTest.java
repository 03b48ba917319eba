package dev.nitid.stars;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.Card;
import dev.nitid.fits.FitsHeader;
import java.util.List;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * A malformed number card (FITS Standard 4.0 §4.2.3-4.2.4) is reported, not read as "no value", by the
 * saturation level and the plate scale.
 */
class HeaderNumbersInStarsTest {
    @ParameterizedTest
    @ValueSource(strings = {"SATURATE", "BZERO", "BSCALE"})
    void malformedSaturationInputsAreReported(String key) {
        FitsHeader h = FitsHeader.of(List.of(new Card(key, "'abc'", null)));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> StarMeasurer.saturationLevel(h, 16));
        assertTrue(e.getMessage().startsWith(key + " is 'abc'"), e.getMessage());
        assertTrue(e.getMessage().contains("saturation level"), e.getMessage());
        // the same card with a number works: unsigned 16-bit ceiling 32768 + 32767, one count below
        // (FITS 4.0 §5.2.5, reference README §6 rule 5)
        FitsHeader ok = FitsHeader.empty().with("BZERO", 32768L, null);
        assertEquals(65534, StarMeasurer.saturationLevel(ok, 16).getAsDouble(), 0);
    }

    @ParameterizedTest
    @ValueSource(strings = {"FOCALLEN", "XPIXSZ", "PIXSIZE1", "XBINNING", "CD1_1", "CDELT2"})
    void malformedPlateScaleInputsAreReported(String key) {
        // a good scale from FOCALLEN and XPIXSZ (reference README §4: 3.76 µm at 1000 mm → 0.775556″/px)
        FitsHeader good = FitsHeader.empty().with("FOCALLEN", 1000.0, null).with("XPIXSZ", 3.76, null);
        assertEquals(0.775556, PlateScale.fromHeader(good).orElseThrow().arcsecPerPixel(), 1e-6);
        FitsHeader h = FitsHeader.of(concat(good.without(key), new Card(key, "12,5", null)));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> PlateScale.fromHeader(h));
        assertTrue(e.getMessage().startsWith(key + " is 12,5"), e.getMessage());
        assertTrue(e.getMessage().contains("plate scale"), e.getMessage());
    }

    private static List<Card> concat(FitsHeader h, Card c) {
        java.util.ArrayList<Card> out = new java.util.ArrayList<>(h.cards());
        out.add(c);
        return out;
    }
}
