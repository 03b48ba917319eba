package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.RandomAccessFile;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.zip.GZIPOutputStream;
import nom.tam.fits.Fits;
import nom.tam.fits.ImageHDU;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Memory and layout limits of the reader, and each nom-tam-fits 1.21.2 pitfall named in the issue, first
 * shown on the library itself and then handled by our reader.
 */
class ReaderLimitsTest {
    /** The pitfall demonstrations call nom-tam-fits directly; its java.util.logging warnings are expected. */
    private static final java.util.logging.Logger NOM_TAM = java.util.logging.Logger.getLogger("nom.tam");

    static {
        NOM_TAM.setLevel(java.util.logging.Level.OFF);
    }

    @TempDir
    Path tmp;

    static byte[] header(String... cards) {
        StringBuilder sb = new StringBuilder();
        for (String c : cards) {
            sb.append(String.format("%-80s", c));
        }
        sb.append(String.format("%-80s", "END"));
        while (sb.length() % 2880 != 0) {
            sb.append(' ');
        }
        return sb.toString().getBytes(StandardCharsets.US_ASCII);
    }

    static String card(String key, Object value) {
        return String.format("%-8s= %20s", key, value);
    }

    @Test
    void hugeDeclaredImageIsRefusedBeforeAllocating() throws Exception {
        // A sparse file really holding 40000 x 40000 16-bit pixels: 3.2 GB on disk, 6.4 GB as float32,
        // beyond the 2 GB test heap (surefire -Xmx2g). nom-tam-fits 1.21.2 runs out of memory on such a file.
        Path f = tmp.resolve("huge.fits");
        byte[] h = header(card("SIMPLE", "T"), card("BITPIX", 16), card("NAXIS", 2), card("NAXIS1", 40000),
                card("NAXIS2", 40000));
        try (RandomAccessFile raf = new RandomAccessFile(f.toFile(), "rw")) {
            raf.write(h);
            raf.setLength(h.length + 40000L * 40000L * 2);
        }
        FitsException e = assertThrows(FitsException.class, () -> FitsReader.read(f));
        assertEquals(FitsException.Kind.TOO_LARGE, e.kind(), e.getMessage());
        assertTrue(e.getMessage().contains("-Xmx"), e.getMessage());
    }

    @Test
    void workingCopiesEnterTheMemoryCheck() throws Exception {
        // 6000 x 6000 float32 = 137 MiB: readable alone, refused when the job needs 40 copies (5.4 GiB)
        // under the 2 GiB test heap; refused before any pixel is allocated.
        Path f = tmp.resolve("mid.fits");
        byte[] h = header(card("SIMPLE", "T"), card("BITPIX", -32), card("NAXIS", 2), card("NAXIS1", 6000),
                card("NAXIS2", 6000));
        try (RandomAccessFile raf = new RandomAccessFile(f.toFile(), "rw")) {
            raf.write(h);
            raf.setLength(h.length + 6000L * 6000L * 4);
        }
        long max = Runtime.getRuntime().maxMemory();
        org.junit.jupiter.api.Assumptions.assumeTrue(max < 4L * 6000 * 6000 * 30, "heap too large for this check");
        FitsException e = assertThrows(FitsException.class,
                () -> FitsReader.read(f, ReadOptions.defaults().withWorkingCopies(40)));
        assertEquals(FitsException.Kind.TOO_LARGE, e.kind());
        assertThrows(IllegalArgumentException.class, () -> ReadOptions.defaults().withWorkingCopies(0));
    }

    @Test
    void planeBeyondTwoBillionPixelsIsRefused() throws Exception {
        Path f = tmp.resolve("wide.fits");
        byte[] h = header(card("SIMPLE", "T"), card("BITPIX", 8), card("NAXIS", 2), card("NAXIS1", 100000),
                card("NAXIS2", 30000));
        try (RandomAccessFile raf = new RandomAccessFile(f.toFile(), "rw")) {
            raf.write(h);
            raf.setLength(h.length + 100000L * 30000L);
        }
        FitsException e = assertThrows(FitsException.class, () -> FitsReader.read(f));
        assertEquals(FitsException.Kind.TOO_LARGE, e.kind(), e.getMessage());
    }

    @Test
    void headerWithoutEndIsCappedNotBuffered() throws Exception {
        // 2001 blocks of blank cards after SIMPLE: the scanner stops at its cap instead of reading on.
        Path f = tmp.resolve("endless.fits");
        try (OutputStream out = Files.newOutputStream(f)) {
            out.write(String.format("%-80s", card("SIMPLE", "T")).getBytes(StandardCharsets.US_ASCII));
            byte[] blank = new byte[2880];
            java.util.Arrays.fill(blank, (byte) ' ');
            out.write(blank, 0, 2800);
            for (int i = 0; i < 2001; i++) {
                out.write(blank);
            }
        }
        FitsException e = assertThrows(FitsException.class, () -> FitsReader.read(f));
        assertTrue(e.getMessage().contains("no END card"), e.getMessage());
    }

    /**
     * Pinned fuzz finding (slow-unit-8045a23a… in the fuzz inputs): nom-tam-fits 1.21.2's whole-header parser
     * removes duplicate keywords by a linear search per card, so a header of repeated cards took 10 s under
     * fuzzing and would take minutes at the header cap. Cards are now parsed one by one. A header at the cap
     * (half distinct keys, half repeated commentary-style cards) must parse in well under the bound: measured
     * about 1 s on a loaded 2-core machine; the quadratic path took over a minute (bound: measured, no source).
     */
    @Test
    void headerAtTheCapParsesInLinearTime() throws Exception {
        int cards = dev.nitid.fits.internal.HduScanner.MAX_HEADER_BLOCKS * 36 - 5;
        String[] c = new String[cards + 2];
        c[0] = card("SIMPLE", "T");
        c[1] = card("BITPIX", 16);
        c[2] = card("NAXIS", 0);
        for (int i = 3; i < c.length; i++) {
            c[i] = i % 2 == 0 ? String.format("K%07d= 1", i) : "E".repeat(80);
        }
        Path f = tmp.resolve("many.fits");
        Files.write(f, header(java.util.Arrays.copyOf(c, cards)));
        long t0 = System.nanoTime();
        FitsException e = assertThrows(FitsException.class, () -> FitsReader.read(f));
        double seconds = (System.nanoTime() - t0) / 1e9;
        assertTrue(e.getMessage().contains("no HDU holds image data"), e.getMessage());
        assertTrue(seconds < 30, "header parsing took " + seconds + " s");
    }

    @Test
    void pitfallBitpix12IsAcceptedByNomTamButRefusedHere() throws Exception {
        byte[] bytes = concat(header(card("SIMPLE", "T"), card("BITPIX", 12), card("NAXIS", 2), card("NAXIS1", 2),
                card("NAXIS2", 2)), new byte[2880]);
        nom.tam.fits.Header nomTam = nom.tam.fits.Header.readHeader(
                new nom.tam.util.FitsInputStream(new ByteArrayInputStream(bytes)));
        assertEquals(12, nomTam.getIntValue("BITPIX"), "nom-tam-fits 1.21.2 takes BITPIX 12 as given");
        Path f = tmp.resolve("b12.fits");
        Files.write(f, bytes);
        FitsException e = assertThrows(FitsException.class, () -> FitsReader.read(f));
        assertEquals("BITPIX", e.keyword());
    }

    @Test
    void pitfallNonFitsBytesGiveNullInNomTamButAnErrorHere() throws Exception {
        Path f = tmp.resolve("notes.fits");
        Files.writeString(f, "just some text that is long enough to be read as a block ".repeat(60));
        try (Fits fits = new Fits(f.toFile())) {
            assertEquals(null, fits.readHDU(), "nom-tam-fits 1.21.2 returns null for non-FITS bytes");
        } catch (nom.tam.fits.FitsException | IOException e) {
            // A later version may throw instead; either way our reader must refuse the file clearly.
        }
        FitsException e = assertThrows(FitsException.class, () -> FitsReader.read(f));
        assertTrue(e.getMessage().contains("not a FITS file"), e.getMessage());
    }

    @Test
    void pitfallTruncatedDataGiveNullKernelInNomTamButAnErrorHere() throws Exception {
        Image img = Image.create(50, 40);
        img.fill(1f);
        Path good = tmp.resolve("good.fits");
        FitsWriter.write(good, img, FitsHeader.empty(), WriteOptions.defaults());
        byte[] all = Files.readAllBytes(good);
        Path cut = tmp.resolve("cut.fits");
        Files.write(cut, java.util.Arrays.copyOf(all, 2880 + 1000));
        Object kernel;
        try (Fits fits = new Fits(cut.toFile())) {
            ImageHDU hdu = (ImageHDU) fits.readHDU();
            kernel = hdu == null ? null : hdu.getKernel();
        } catch (nom.tam.fits.FitsException | IOException e) {
            kernel = null;
        }
        assertEquals(null, kernel, "nom-tam-fits 1.21.2 gives no pixels for truncated data");
        FitsException e = assertThrows(FitsException.class, () -> FitsReader.read(cut));
        assertTrue(e.getMessage().contains("truncated"), e.getMessage());
    }

    @Test
    void gzipFileReadsLikeThePlainOne() throws Exception {
        Image img = Image.create(30, 20, 2);
        for (int i = 0; i < img.pixelCount(); i++) {
            img.plane(0)[i] = i * 0.25f;
            img.plane(1)[i] = -i;
        }
        Path plain = tmp.resolve("p.fits");
        FitsWriter.write(plain, img, FitsHeader.empty().with("OBJECT", "gz test", null), WriteOptions.defaults());
        Path gz = tmp.resolve("p.fits.gz");
        try (OutputStream out = new GZIPOutputStream(Files.newOutputStream(gz))) {
            out.write(Files.readAllBytes(plain));
        }
        FitsImage a = FitsReader.read(plain);
        FitsImage b = FitsReader.read(gz);
        for (int p = 0; p < 2; p++) {
            assertEquals(java.util.Arrays.toString(a.image().plane(p)), java.util.Arrays.toString(b.image().plane(p)));
        }
        assertEquals(a.header(), b.header());
    }

    @Test
    void firstImageSkipsAnEmptyPrimaryAndHduSelectsOne() throws Exception {
        byte[] prim = header(card("SIMPLE", "T"), card("BITPIX", 8), card("NAXIS", 0), card("EXTEND", "T"));
        byte[] table = concat(header(card("XTENSION", "'BINTABLE'"), card("BITPIX", 8), card("NAXIS", 2),
                card("NAXIS1", 4), card("NAXIS2", 1), card("PCOUNT", 0), card("GCOUNT", 1), card("TFIELDS", 1),
                card("TFORM1", "'1E      '")), new byte[2880]);
        byte[] ext = header(card("XTENSION", "'IMAGE   '"), card("BITPIX", 16), card("NAXIS", 2), card("NAXIS1", 2),
                card("NAXIS2", 1), card("PCOUNT", 0), card("GCOUNT", 1), card("EXTNAME", "'SCI     '"));
        byte[] data = new byte[2880];
        data[1] = 7;
        data[3] = 9;
        Path f = tmp.resolve("ext.fits");
        Files.write(f, concat(prim, table, ext, data));
        FitsImage fi = FitsReader.read(f);
        assertEquals(2, fi.hdu());
        assertEquals(7f, fi.image().get(0, 0));
        assertEquals(9f, fi.image().get(1, 0));
        assertEquals("SCI", fi.header().getString("EXTNAME").orElseThrow());
        assertEquals(2, FitsReader.read(f, new ReadOptions(2)).hdu());
        FitsException notImage = assertThrows(FitsException.class, () -> FitsReader.read(f, new ReadOptions(1)));
        assertEquals("XTENSION", notImage.keyword());
        FitsException none = assertThrows(FitsException.class, () -> FitsReader.read(f, new ReadOptions(3)));
        assertTrue(none.getMessage().contains("HDUs 0 to 2"), none.getMessage());
        FitsException empty = assertThrows(FitsException.class, () -> FitsReader.read(f, new ReadOptions(0)));
        assertEquals(0, empty.hdu());
    }

    @Test
    void missingFileAndFolderAreNotBadData() throws Exception {
        assertEquals(FitsException.Kind.NOT_FOUND,
                assertThrows(FitsException.class, () -> FitsReader.read(tmp.resolve("absent.fits"))).kind());
        assertEquals(FitsException.Kind.UNREADABLE,
                assertThrows(FitsException.class, () -> FitsReader.read(tmp)).kind());
    }

    static byte[] concat(byte[]... parts) {
        int n = 0;
        for (byte[] p : parts) {
            n += p.length;
        }
        byte[] out = new byte[n];
        int off = 0;
        for (byte[] p : parts) {
            System.arraycopy(p, 0, out, off, p.length);
            off += p.length;
        }
        return out;
    }
}
