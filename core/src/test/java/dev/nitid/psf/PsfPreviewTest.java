package dev.nitid.psf;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.awt.image.BufferedImage;
import org.junit.jupiter.api.Test;

/** The preview draws headless and puts the PSF's peak at the centre of its panel in the brightest colour. */
class PsfPreviewTest {
    @Test
    void drawsPsfProfileAndEnergy() {
        System.setProperty("java.awt.headless", "true");
        MoffatPsf m = MoffatPsf.ofFwhm(4, 3);
        Image img = m.render(41);
        BufferedImage pic = PsfPreview.draw(img, PsfFigures.of(img), "moffat");
        assertTrue(pic.getWidth() > PsfPreview.PANEL + PsfPreview.PLOT_W, "room for both plots");
        int cx = PsfPreview.GAP + PsfPreview.PANEL / 2;
        int cy = PsfPreview.TITLE + 10 + PsfPreview.PANEL / 2;
        assertEquals(PsfPreview.colour(1), pic.getRGB(cx, cy) & 0xFFFFFF, "peak pixel drawn at the top of the ramp");
        int corner = pic.getRGB(PsfPreview.GAP + 2 + (PsfPreview.PANEL - 41 * (PsfPreview.PANEL / 41)) / 2,
                PsfPreview.TITLE + 12 + (PsfPreview.PANEL - 41 * (PsfPreview.PANEL / 41)) / 2) & 0xFFFFFF;
        assertTrue(brightness(corner) < brightness(PsfPreview.colour(0.5)), "wings are dark: " + Integer.toHexString(corner));
    }

    private static int brightness(int rgb) {
        return ((rgb >> 16) & 255) + ((rgb >> 8) & 255) + (rgb & 255);
    }
}
