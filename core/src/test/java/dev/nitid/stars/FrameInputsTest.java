package dev.nitid.stars;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.FitsHeader;
import dev.nitid.image.Image;
import org.junit.jupiter.api.Test;

/** What {@link StarMeasurer#measure(dev.nitid.fits.FitsImage, MeasureSettings)} takes from a frame. */
class FrameInputsTest {
    @Test
    void saturationFromKeywordThenIntegerCeiling() {
        // FITS standard 4.0 §5.2.5 (reference README §6): unsigned 16-bit is BITPIX 16 with BZERO 32768, so the
        // physical ceiling is 32768 + 32767 = 65535; one count below it is used.
        FitsHeader u16 = FitsHeader.empty().with("BZERO", 32768.0, "").with("BSCALE", 1.0, "");
        assertEquals(65534, StarMeasurer.saturationLevel(u16, 16).getAsDouble(), 0);
        assertEquals(32766, StarMeasurer.saturationLevel(FitsHeader.empty(), 16).getAsDouble(), 0);
        assertEquals(254, StarMeasurer.saturationLevel(FitsHeader.empty(), 8).getAsDouble(), 0);
        assertEquals(50000, StarMeasurer.saturationLevel(u16.with("SATURATE", 50000.0, ""), 16).getAsDouble(), 0);
        assertTrue(StarMeasurer.saturationLevel(FitsHeader.empty(), -32).isEmpty(), "float data: no ceiling");
    }

    @Test
    void colourPlanesAreAveraged() {
        Image rgb = Image.create(2, 1, 3);
        rgb.set(0, 0, 0, 3f);
        rgb.set(1, 0, 0, 6f);
        rgb.set(2, 0, 0, 9f);
        rgb.set(2, 1, 0, 3f);
        Image l = StarMeasurer.luminance(rgb);
        assertEquals(1, l.planes());
        assertEquals(6f, l.get(0, 0), 1e-6f);
        assertEquals(1f, l.get(1, 0), 1e-6f);
        Image mono = Image.create(2, 2);
        assertTrue(StarMeasurer.luminance(mono) == mono, "a single plane is used as it is");
    }
}
