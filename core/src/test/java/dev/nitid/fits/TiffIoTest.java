package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * TIFF export/import through the JDK ImageIO plugin, checked against tifffile 2023.2.3 (Debian
 * python3-tifffile) as the outside reader and writer: bit-exact float32, exact uint16, and the row-order
 * rule (TIFF row r = image row height−1−r).
 */
class TiffIoTest {
    @TempDir
    Path tmp;

    static Image gradient(int w, int h, int planes) {
        Image img = Image.create(w, h, planes);
        SplittableRandom rnd = new SplittableRandom(42);
        for (int p = 0; p < planes; p++) {
            for (int i = 0; i < img.pixelCount(); i++) {
                img.plane(p)[i] = (float) (rnd.nextGaussian() * 1e3 + p);
            }
        }
        return img;
    }

    @Test
    void float32RoundTripIsBitExact() throws Exception {
        for (int planes : new int[] {1, 3}) {
            Image img = gradient(17, 11, planes);
            img.plane(0)[3] = Float.NaN;
            img.plane(0)[4] = Float.NEGATIVE_INFINITY;
            img.plane(0)[5] = Float.MIN_VALUE;
            Path f = tmp.resolve("f" + planes + ".tif");
            TiffIo.write(f, img, WriteOptions.defaults());
            Image back = TiffIo.read(f);
            assertTrue(img.sameShape(back));
            for (int p = 0; p < planes; p++) {
                for (int i = 0; i < img.pixelCount(); i++) {
                    assertEquals(Float.floatToIntBits(img.plane(p)[i]), Float.floatToIntBits(back.plane(p)[i]),
                            "plane " + p + " pixel " + i);
                }
            }
        }
    }

    @Test
    void uint16RoundTripIsExactAndClipsLikeFits() throws Exception {
        Image img = Image.create(256, 256);
        for (int i = 0; i < img.pixelCount(); i++) {
            img.plane(0)[i] = i;
        }
        Path f = tmp.resolve("u16.tif");
        WriteReport r = TiffIo.write(f, img, WriteOptions.defaults().withBitpix(16));
        assertEquals(0, r.clippedPixels());
        Image back = TiffIo.read(f);
        for (int i = 0; i < img.pixelCount(); i++) {
            assertEquals(img.plane(0)[i], back.plane(0)[i], 0f);
        }
        WriteReport r2 = TiffIo.write(tmp.resolve("c.tif"), Image.wrap(3, 1, new float[] {-5f, 1.5f, 1e6f}),
                WriteOptions.defaults().withBitpix(16));
        assertEquals(2, r2.clippedPixels());
        assertTrue(r2.rounded());
    }

    @Test
    void tifffileSeesTheSameSamplesTopRowFirst() throws Exception {
        Image img = gradient(7, 5, 1);
        Path f = tmp.resolve("x.tif");
        TiffIo.write(f, img, WriteOptions.defaults());
        String out = ExternalTools.python(String.join("\n",
                "import sys, tifffile",
                "a = tifffile.imread(sys.argv[1])",
                "print(a.dtype.str, a.shape[0], a.shape[1])",
                "for row in a: print(' '.join(repr(float(v)) for v in row))"), f.toString());
        List<String> lines = out.lines().toList();
        assertEquals("<f4 5 7", lines.get(0), "little- or big-endian float32, 5 rows of 7");
        for (int r = 0; r < 5; r++) {
            String[] v = lines.get(1 + r).split(" ");
            for (int x = 0; x < 7; x++) {
                // TIFF row r (top first) is image row 4 - r (bottom first, FITS order).
                assertEquals(img.get(x, 4 - r), (float) Double.parseDouble(v[x]), 0f, "row " + r + " col " + x);
            }
        }
    }

    @Test
    void readsFloatAndUint16FilesWrittenByTifffile() throws Exception {
        Path f32 = tmp.resolve("tf32.tif");
        Path u16 = tmp.resolve("tu16.tif");
        ExternalTools.python(String.join("\n",
                "import sys, numpy as np, tifffile",
                "a = (np.arange(35, dtype=np.float32).reshape(5, 7) - 3.25) * np.float32(1.5)",
                "tifffile.imwrite(sys.argv[1], a)",
                "tifffile.imwrite(sys.argv[2], (np.arange(35, dtype=np.uint16).reshape(5, 7) * 1800))"),
                f32.toString(), u16.toString());
        Image a = TiffIo.read(f32);
        Image b = TiffIo.read(u16);
        for (int r = 0; r < 5; r++) {
            for (int x = 0; x < 7; x++) {
                int k = r * 7 + x;
                assertEquals((k - 3.25f) * 1.5f, a.get(x, 4 - r), 0f);
                assertEquals(k * 1800f, b.get(x, 4 - r), 0f);
            }
        }
    }

    @Test
    void fitsToTiffToFitsKeepsRows() throws Exception {
        Image img = gradient(9, 4, 1);
        Path fits = tmp.resolve("a.fits");
        FitsWriter.write(fits, img, FitsHeader.empty(), WriteOptions.defaults());
        Path tif = tmp.resolve("a.tif");
        TiffIo.write(tif, FitsReader.read(fits).image(), WriteOptions.defaults());
        Image back = TiffIo.read(tif);
        for (int i = 0; i < img.pixelCount(); i++) {
            assertEquals(img.plane(0)[i], back.plane(0)[i], 0f);
        }
    }

    @Test
    void refusesWhatItCannotDo() throws Exception {
        assertThrows(IllegalArgumentException.class,
                () -> TiffIo.write(tmp.resolve("p.tif"), Image.create(2, 2, 2), WriteOptions.defaults()));
        Path notTiff = tmp.resolve("n.tif");
        Files.writeString(notTiff, "not an image");
        FitsException e = assertThrows(FitsException.class, () -> TiffIo.read(notTiff));
        assertEquals(FitsException.Kind.BAD_DATA, e.kind());
        Path exists = tmp.resolve("e.tif");
        Files.writeString(exists, "keep");
        assertEquals(FitsException.Kind.OUTPUT_EXISTS, assertThrows(FitsException.class,
                () -> TiffIo.write(exists, Image.create(2, 2), WriteOptions.defaults())).kind());
        assertEquals("keep", Files.readString(exists));
    }
}
