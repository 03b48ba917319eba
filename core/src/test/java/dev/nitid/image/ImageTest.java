package dev.nitid.image;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotSame;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** The storage contract of {@link Image}: row-major {@code index = y·width + x}, views share, copies do not. */
class ImageTest {
    @Test
    void pixelIndexIsRowMajor() {
        Image im = Image.create(4, 3, 2);
        im.set(1, 3, 2, 7f);
        assertEquals(7f, im.plane(1)[2 * 4 + 3]);
        assertEquals(7f, im.get(1, 3, 2));
        assertEquals(0f, im.get(3, 2), "plane 0 untouched");
        assertEquals(12, im.pixelCount());
    }

    @Test
    void viewsShareAndCopiesDoNot() {
        float[] data = new float[6];
        Image im = Image.wrap(3, 2, data);
        assertSame(data, im.plane(0));
        im.planeImage(0).set(2, 1, 5f);
        assertEquals(5f, data[5]);
        Image c = im.copy();
        assertNotSame(data, c.plane(0));
        c.set(0, 0, 9f);
        assertEquals(0f, data[0]);
        assertTrue(c.sameShape(im));
    }

    @Test
    void rejectsBadShapesWithTheFix() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Image.wrap(3, 2, new float[5]));
        assertTrue(e.getMessage().contains("5 pixels") && e.getMessage().contains("3x2"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> Image.create(0, 2));
        assertThrows(IllegalArgumentException.class, () -> Image.create(2, 2, 0));
        assertThrows(IndexOutOfBoundsException.class, () -> Image.create(2, 2).get(2, 0));
    }
}
