package dev.nitid.fits;

import dev.nitid.fits.FitsException.Kind;
import dev.nitid.fits.internal.HduScanner;
import dev.nitid.fits.internal.SafeOutput;
import dev.nitid.image.Image;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.math.BigDecimal;
import java.math.BigInteger;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.time.format.DateTimeFormatter;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import nom.tam.fits.Header;
import nom.tam.fits.HeaderCard;
import nom.tam.fits.HeaderCardException;
import nom.tam.fits.utilities.FitsCheckSum;
import nom.tam.util.FitsOutputStream;

/**
 * Writes an image as a single-HDU FITS file (FITS Standard 4.0): float32 by default, or an integer type on
 * request (see {@link WriteOptions#bitpix()}).
 *
 * <p>Header: the mandatory cards (SIMPLE, BITPIX, NAXIS, NAXISn, EXTEND), BZERO/BSCALE when the output type
 * needs them, then every card of the given header in order except the structural and stale ones
 * ({@link #DROPPED}), then a fresh DATE (UTC, {@code YYYY-MM-DDThh:mm:ss}, FITS 4.0 §4.4.2.1) and DATASUM /
 * CHECKSUM computed by nom-tam-fits over the written bytes (FITS checksum convention, Seaman et al. 2002,
 * registered with the IAU FITS Working Group). WCS cards pass through untouched. Copying only the cards, and
 * never a whole foreign header object, avoids the nom-tam-fits behaviour where a copied header carries
 * BZERO/BSCALE/CHECKSUM into a float HDU (astropy then read 1.5 back as 32769.5).
 *
 * <p>Publication is safe ({@link SafeOutput}): temporary file in the output folder, forced to disk, renamed
 * into place without clobbering; protected inputs are never written; a failure leaves no file.
 *
 * <p>Row order: image row 0 is written first (FITS pixel row 1).
 *
 * <p>Stateless and thread-safe.
 */
public final class FitsWriter {
    /** Keywords never copied from the caller's header: they describe the old data unit, or are recomputed. */
    public static final Set<String> DROPPED = Set.of("SIMPLE", "XTENSION", "BITPIX", "NAXIS", "EXTEND", "PCOUNT",
            "GCOUNT", "GROUPS", "BZERO", "BSCALE", "BLANK", "DATAMIN", "DATAMAX", "CHECKSUM", "DATASUM", "DATE",
            "END", "INHERIT", "ZIMAGE");

    /** Keywords that may repeat (FITS Standard 4.0 §4.4.2.4, commentary keywords). */
    private static final Set<String> REPEATABLE = Set.of("COMMENT", "HISTORY", "");

    private static final int CHUNK_PIXELS = 1 << 14;
    private static final DateTimeFormatter DATE = DateTimeFormatter.ofPattern("yyyy-MM-dd'T'HH:mm:ss", Locale.ROOT);

    private FitsWriter() {
    }

    /**
     * Writes {@code image} with {@code header}'s cards to {@code file}.
     *
     * @param file    the output path
     * @param image   the pixels (input, not modified); planes become NAXIS3
     * @param header  cards to carry (input, not modified); structural and stale ones are dropped
     * @param options output type, overwrite policy, protected inputs
     * @return what was written: the path, clipped pixel count, whether rounding occurred
     * @throws FitsException if the output exists (without overwrite), would replace a protected input,
     *                       cannot be created, or writing fails
     */
    public static WriteReport write(Path file, Image image, FitsHeader header, WriteOptions options)
            throws FitsException {
        if (file == null || image == null || header == null || options == null) {
            throw new IllegalArgumentException("file, image, header and options must not be null");
        }
        SafeOutput.check(file, options.overwrite(), options.protectedInputs());
        int bitpix = options.bitpix();
        Encoder enc = new Encoder(image, bitpix);
        long datasum;
        try {
            datasum = enc.pass(null);
        } catch (IOException e) {
            throw new IllegalStateException("encoding to memory cannot fail", e);
        }
        Header h = buildHeader(file, image, header, bitpix, datasum);
        byte[] headerBytes = headerBytes(file, h);
        SafeOutput.write(file, options.overwrite(), options.protectedInputs(), ch -> {
            writeAll(ch, ByteBuffer.wrap(headerBytes));
            enc.pass(ch);
        });
        return new WriteReport(file, enc.clipped, enc.rounded);
    }

    private static Header buildHeader(Path file, Image image, FitsHeader header, int bitpix, long datasum)
            throws FitsException {
        Header h = new Header();
        try {
            h.addValue("SIMPLE", true, "conforms to FITS standard");
            h.addValue("BITPIX", bitpix, "array data type");
            int naxis = image.planes() > 1 ? 3 : 2;
            h.addValue("NAXIS", naxis, "number of array dimensions");
            h.addValue("NAXIS1", image.width(), "columns");
            h.addValue("NAXIS2", image.height(), "rows");
            if (naxis == 3) {
                h.addValue("NAXIS3", image.planes(), "planes");
            }
            h.addValue("EXTEND", true, null);
            if (bitpix == 16) {
                h.addValue("BZERO", 32768, "unsigned 16-bit: physical = stored + 32768");
                h.addValue("BSCALE", 1, null);
            }
            boolean longStrings = false;
            // nom-tam-fits keeps one card per keyword (COMMENT, HISTORY and blank excepted) and finds the
            // one to replace by a linear search; removing duplicates here (the last one wins, as there)
            // keeps building the header linear in the number of cards.
            java.util.Map<String, Integer> last = new java.util.HashMap<>();
            List<Card> all = header.cards();
            for (int i = 0; i < all.size(); i++) {
                last.put(all.get(i).key().toUpperCase(Locale.ROOT), i);
            }
            for (int i = 0; i < all.size(); i++) {
                Card c = all.get(i);
                String key = c.key().toUpperCase(Locale.ROOT);
                if (DROPPED.contains(key) || key.matches("NAXIS\\d+")) {
                    continue;
                }
                if (!REPEATABLE.contains(key) && last.get(key) != i) {
                    continue;
                }
                HeaderCard card;
                try {
                    card = toNomTam(c);
                } catch (RuntimeException e) {
                    // A card nom-tam-fits cannot re-create (odd key or value form) is kept as readable text
                    // rather than failing the whole write or dropping it silently.
                    String text = (c.key() + " = " + c.value() + (c.comment() == null ? "" : " / " + c.comment()));
                    card = HeaderCard.createCommentCard(text.length() > FitsHeader.COMMENTARY_WIDTH
                            ? text.substring(0, FitsHeader.COMMENTARY_WIDTH) : text);
                }
                longStrings |= card.cardSize() > 1 && !card.isCommentStyleCard();
                h.addLine(card);
            }
            if (longStrings && !h.containsKey("LONGSTRN")) {
                // Announces CONTINUE cards (HEASARC long-string convention, OGIP 1.0; fitsverify warns
                // without it). CONTINUE itself is part of FITS Standard 4.0 §4.2.1.2.
                h.addValue("LONGSTRN", "OGIP 1.0", "The OGIP long string convention may be used");
            }
            h.addValue("DATE", ZonedDateTime.now(ZoneOffset.UTC).truncatedTo(ChronoUnit.SECONDS).format(DATE),
                    "UTC date this file was written");
            FitsCheckSum.setDatasum(h, datasum);
        } catch (RuntimeException e) {
            throw new FitsException(Kind.WRITE_FAILED, file, 0, null, "the header cannot be written ("
                    + e.getMessage() + ") (remove or fix the offending card before writing)", e);
        }
        return h;
    }

    private static HeaderCard toNomTam(Card c) throws HeaderCardException {
        String key = c.key();
        if (c.value() == null) {
            return HeaderCard.createCommentStyleCard(key, c.comment() == null ? "" : c.comment());
        }
        String v = c.value().trim();
        if (c.isString()) {
            return new HeaderCard(key, FitsHeader.unquote(v), c.comment());
        }
        if (v.equals("T") || v.equals("F")) {
            return new HeaderCard(key, v.equals("T"), c.comment());
        }
        String num = v.startsWith("+") ? v.substring(1) : v;
        try {
            if (num.matches("-?\\d+")) {
                BigInteger bi = new BigInteger(num);
                return new HeaderCard(key, bi.bitLength() < 64 ? (Number) bi.longValue() : bi, c.comment());
            }
            return new HeaderCard(key, new BigDecimal(num.replace('D', 'E').replace('d', 'e')), c.comment());
        } catch (NumberFormatException e) {
            // Complex numbers and other rare forms: keep the text as a string rather than lose the card.
            return new HeaderCard(key, v, c.comment());
        }
    }

    private static byte[] headerBytes(Path file, Header h) throws FitsException {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream(HduScanner.BLOCK * 2);
        try (FitsOutputStream out = new FitsOutputStream(bytes)) {
            h.write(out);
            out.flush();
        } catch (IOException | RuntimeException e) {
            throw new FitsException(Kind.WRITE_FAILED, file, 0, null, "the header cannot be written ("
                    + e.getMessage() + ") (remove or fix the offending card before writing)", e);
        }
        return bytes.toByteArray();
    }

    private static void writeAll(FileChannel ch, ByteBuffer buf) throws IOException {
        while (buf.hasRemaining()) {
            ch.write(buf);
        }
    }

    /**
     * Turns pixels into big-endian stored values, chunk by chunk. The same pass runs twice: once to compute
     * DATASUM (which the header needs before any data are written) and once to write; converting twice costs
     * less than holding a second copy of a large image.
     */
    private static final class Encoder {
        private final Image image;
        private final int bitpix;
        private final int bytesPer;
        long clipped;
        boolean rounded;

        Encoder(Image image, int bitpix) {
            this.image = image;
            this.bitpix = bitpix;
            this.bytesPer = Math.abs(bitpix) / 8;
        }

        /** Encodes every pixel; writes to {@code ch} if given; returns the data checksum (padding included). */
        long pass(FileChannel ch) throws IOException {
            clipped = 0;
            rounded = false;
            ByteBuffer buf = ByteBuffer.allocate(CHUNK_PIXELS * bytesPer).order(ByteOrder.BIG_ENDIAN);
            long sum = 0;
            long total = 0;
            for (int p = 0; p < image.planes(); p++) {
                float[] px = image.plane(p);
                for (int i = 0; i < px.length; i++) {
                    put(buf, px[i]);
                    if (!buf.hasRemaining()) {
                        sum = flush(buf, ch, sum);
                        total += buf.capacity();
                        buf.clear();
                    }
                }
            }
            int rest = buf.position();
            long pad = (HduScanner.BLOCK - (total + rest) % HduScanner.BLOCK) % HduScanner.BLOCK;
            if (rest > 0 || pad > 0) {
                // Zero padding to the block (FITS 4.0 §3.3.2); the chunk size is a multiple of 4, so the
                // 32-bit checksum words stay aligned across chunks.
                ByteBuffer tail = ByteBuffer.allocate((int) (rest + pad));
                buf.flip();
                tail.put(buf);
                tail.position(tail.capacity());
                sum = flush(tail, ch, sum);
            }
            return sum;
        }

        private long flush(ByteBuffer buf, FileChannel ch, long sum) throws IOException {
            buf.flip();
            long s = FitsCheckSum.checksum(buf.duplicate());
            if (ch != null) {
                writeAll(ch, buf);
            }
            return FitsCheckSum.sumOf(sum, s);
        }

        private void put(ByteBuffer buf, float v) {
            switch (bitpix) {
                case -32 -> buf.putFloat(v);
                case -64 -> buf.putDouble(v);
                case 8 -> buf.put((byte) toInt(v, 0, 255));
                case 16 -> buf.putShort((short) (toInt(v, 0, 65535) - 32768));
                default -> buf.putInt((int) toLong(v, Integer.MIN_VALUE, Integer.MAX_VALUE));
            }
        }

        private int toInt(float v, int lo, int hi) {
            return (int) toLong(v, lo, hi);
        }

        private long toLong(float v, long lo, long hi) {
            if (Float.isNaN(v)) {
                clipped++;
                return lo <= 0 && hi >= 0 ? 0 : lo;
            }
            double r = Math.rint(v);
            if (r != v) {
                rounded = true;
            }
            if (r < lo) {
                clipped++;
                return lo;
            }
            if (r > hi) {
                clipped++;
                return hi;
            }
            return (long) r;
        }
    }
}
