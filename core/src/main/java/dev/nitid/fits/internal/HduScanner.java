package dev.nitid.fits.internal;

import dev.nitid.fits.Card;
import dev.nitid.fits.FitsException;
import dev.nitid.fits.FitsException.Kind;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Locale;
import nom.tam.fits.HeaderCard;
import nom.tam.util.FitsInputStream;

/**
 * Walks the HDUs of a FITS byte stream one at a time, validating each header's structure before anything
 * is allocated for its data: SIMPLE first in the primary header, XTENSION first in extensions, printable
 * ASCII cards, an END card, a legal BITPIX, 0 ≤ NAXIS ≤ 999, non-negative axis lengths, and a data size
 * that neither overflows nor (for a plain file of known length) runs past the end of the file.
 *
 * <p>Header text is parsed card by card by nom-tam-fits ({@link HeaderCard#HeaderCard(nom.tam.util.ArrayDataInput)}); the structural
 * checks are ours because nom-tam-fits 1.21.2 accepts an illegal BITPIX such as 12 and trusts declared sizes.
 *
 * <p>Rules from the FITS Standard 4.0 (IAU FITS Working Group 2018): §3.1 (2880-byte blocks), §4.1 (cards),
 * §4.4.1 (mandatory keywords), §7.1 (IMAGE extension), Table 8 (BITPIX values), §4.4.1.1 (data size
 * {@code |BITPIX| × GCOUNT × (PCOUNT + NAXIS1 × … × NAXISn) / 8}).
 *
 * <p>Not thread-safe; one scanner per stream.
 */
public final class HduScanner {
    /** FITS logical record length in bytes (FITS Standard 4.0 §3.1). */
    public static final int BLOCK = 2880;
    /** Card length in bytes (FITS Standard 4.0 §4.1.1). */
    public static final int CARD = 80;
    /**
     * Largest header accepted, in blocks: 1000 blocks = 36 000 cards. Real headers have at most a few
     * thousand cards; the cap keeps a header without END (or a compressed bomb) from filling the heap and
     * bounds the parsing time (about 1 s at the cap on a loaded 2-core machine).
     */
    public static final int MAX_HEADER_BLOCKS = 1000;
    /** Largest NAXIS allowed by the standard (FITS Standard 4.0 §4.4.1.1). */
    public static final int MAX_NAXIS = 999;

    /** What one HDU holds, from its validated header. */
    public enum Type {
        /** A primary array or IMAGE extension with at least one pixel. */
        IMAGE,
        /** A primary array or IMAGE extension with no pixels (NAXIS = 0 or a zero axis). */
        EMPTY,
        /** A BINTABLE holding a tile-compressed image (ZIMAGE = T). */
        COMPRESSED_IMAGE,
        /** Anything else: tables, random groups, unknown extensions. */
        OTHER
    }

    /**
     * One validated HDU header.
     *
     * @param index     0 = primary
     * @param type      what it holds
     * @param xtension  the XTENSION value, or "PRIMARY"
     * @param bitpix    BITPIX
     * @param axes      NAXIS1..NAXISn (lengths, ≥ 0)
     * @param dataBytes bytes of data declared, before padding to a block
     * @param cards     the header cards in file order, duplicates included
     * @param keyed     the first card of each keyword, as parsed by nom-tam-fits (for value lookups)
     */
    public record HduInfo(int index, Type type, String xtension, int bitpix, long[] axes, long dataBytes,
                          List<Card> cards, Map<String, HeaderCard> keyed) {
        /** @return bytes the data unit occupies in the file, padded to whole blocks */
        public long paddedDataBytes() {
            return (dataBytes + BLOCK - 1) / BLOCK * BLOCK;
        }

        /**
         * @param key keyword, upper case
         * @return the first card with this keyword, or null
         */
        public HeaderCard card(String key) {
            return keyed.get(key);
        }
    }

    private final Path file;
    private final InputStream in;
    private final long fileLength;
    private long position;

    /**
     * @param file       the file, for messages only
     * @param in         the (decompressed) stream, positioned at the start of the file
     * @param fileLength the stream's length when known (plain files), or −1 (compressed files)
     */
    public HduScanner(Path file, InputStream in, long fileLength) {
        this.file = file;
        this.in = in;
        this.fileLength = fileLength;
    }

    /** @return bytes consumed from the stream so far */
    public long position() {
        return position;
    }

    /** @return the stream, positioned wherever the last call left it */
    public InputStream stream() {
        return in;
    }

    /**
     * Reads and validates the next header.
     *
     * @param index the index of the HDU expected next, 0 = primary
     * @return the HDU, or null at the end of the file (only for index ≥ 1)
     * @throws FitsException if the header is missing, damaged or illegal
     * @throws IOException   on a read error
     */
    public HduInfo next(int index) throws FitsException, IOException {
        byte[] block = new byte[BLOCK];
        int got = readBlock(block);
        if (index == 0) {
            if (got == 0) {
                throw bad(-1, null, "the file is empty (0 bytes), so it is not a FITS file "
                        + "(check that the right file was given and that it was copied completely)");
            }
        } else if (got < CARD || !startsWith(block, "XTENSION")) {
            // The standard allows nothing but extensions after the primary HDU, yet trailing padding or
            // junk is common in files from small writers; like most readers we stop here.
            return null;
        }
        if (index == 0 && !startsWith(block, "SIMPLE  =")) {
            throw bad(-1, "SIMPLE", "this is not a FITS file, as it does not start with the card SIMPLE = T "
                    + "(check the file name; FITS files start with the text 'SIMPLE')");
        }
        List<byte[]> blocks = new ArrayList<>();
        while (true) {
            if (got < BLOCK) {
                int firstMissing = blocks.size() * (BLOCK / CARD) + got / CARD;
                throw bad(index, null, "the header stops after " + firstMissing
                        + " cards without an END card, so the file is truncated or not FITS "
                        + "(copy the file again from its source)");
            }
            blocks.add(block);
            if (scanCards(block, blocks.size() - 1, index) >= 0) {
                break;
            }
            if (blocks.size() >= MAX_HEADER_BLOCKS) {
                throw bad(index, null, "no END card in the first " + (MAX_HEADER_BLOCKS * (BLOCK / CARD))
                        + " header cards, so this is not a valid FITS header (the file is damaged)");
            }
            block = new byte[BLOCK];
            got = readBlock(block);
        }
        List<String> images = new ArrayList<>(blocks.size() * (BLOCK / CARD));
        for (byte[] b : blocks) {
            for (int off = 0; off < BLOCK; off += CARD) {
                String card = new String(b, off, CARD, StandardCharsets.US_ASCII);
                if (card.startsWith("END     ")) {
                    return validate(index, parse(images, index));
                }
                images.add(card);
            }
        }
        throw new IllegalStateException("END card found by scanCards but not here");
    }

    /**
     * Skips the data unit of {@code hdu} (padding included).
     *
     * @param hdu the HDU just returned by {@link #next(int)}
     * @throws FitsException if the stream ends inside the data
     * @throws IOException   on a read error
     */
    public void skipData(HduInfo hdu) throws FitsException, IOException {
        long toSkip = hdu.paddedDataBytes();
        long skipped = 0;
        byte[] sink = null;
        while (skipped < toSkip) {
            long s = in.skip(toSkip - skipped);
            if (s <= 0) {
                if (sink == null) {
                    sink = new byte[8192];
                }
                int r = in.read(sink, 0, (int) Math.min(sink.length, toSkip - skipped));
                if (r < 0) {
                    break;
                }
                s = r;
            }
            skipped += s;
            position += s;
        }
        if (skipped < hdu.dataBytes()) {
            throw truncated(hdu, skipped);
        }
    }

    /** Counts bytes read by the caller directly from {@link #stream()}. */
    public void advance(long bytes) {
        position += bytes;
    }

    /**
     * The error for data that end early.
     *
     * @param hdu     the HDU
     * @param present data bytes actually present, or −1 if unknown
     * @return the exception to throw
     */
    public FitsException truncated(HduInfo hdu, long present) {
        return bad(hdu.index(), null, "the data unit declares " + hdu.dataBytes() + " bytes ("
                + describeAxes(hdu.axes()) + ", BITPIX " + hdu.bitpix() + ") but "
                + (present < 0 ? "the file ends before all of them" : "only " + present + " are present")
                + ", so the file is truncated (copy it again from its source)");
    }

    private int readBlock(byte[] block) throws IOException {
        int n = 0;
        while (n < BLOCK) {
            int r = in.read(block, n, BLOCK - n);
            if (r < 0) {
                break;
            }
            n += r;
        }
        position += n;
        return n;
    }

    /** @return the index of the END card in this block, or −1 */
    private int scanCards(byte[] block, int blockIndex, int hdu) throws FitsException {
        for (int c = 0; c < BLOCK / CARD; c++) {
            int off = c * CARD;
            for (int i = 0; i < CARD; i++) {
                int b = block[off + i] & 0xFF;
                if (b < 0x20 || b > 0x7E) {
                    int cardNo = blockIndex * (BLOCK / CARD) + c + 1;
                    throw bad(hdu, null, "header card " + cardNo + " holds the byte 0x"
                            + String.format("%02X", b) + " at column " + (i + 1)
                            + ", but FITS headers are printable ASCII only, so the header is damaged "
                            + "(re-export the file from the program that made it)");
                }
            }
            if (block[off] == 'E' && block[off + 1] == 'N' && block[off + 2] == 'D' && allBlank(block, off + 3, 5)) {
                return c;
            }
        }
        return -1;
    }

    /** Parsed cards of one header: in file order, and the first card of each keyword. */
    private record Parsed(List<Card> cards, Map<String, HeaderCard> keyed) {
    }

    /**
     * Parses card by card with nom-tam-fits' card parser. The whole-header parser of nom-tam-fits 1.21.2
     * removes duplicate keywords with a linear search per card, which made a hostile header of a few
     * thousand repeated cards take seconds (found by fuzzing); parsing cards one by one is linear.
     * Long strings: a string ending in {@code &} continues in the following CONTINUE cards
     * (FITS Standard 4.0 §4.2.1.2).
     */
    private Parsed parse(List<String> images, int index) throws FitsException {
        List<Card> cards = new ArrayList<>(images.size());
        Map<String, HeaderCard> keyed = new HashMap<>();
        HeaderCard open = null;
        StringBuilder longValue = null;
        StringBuilder longComment = null;
        StringBuilder all = new StringBuilder(images.size() * CARD);
        for (String image : images) {
            all.append(image);
        }
        // One stream for all cards: HeaderCard.create(String) builds a buffered stream per card, which
        // costs about 50 µs each and made a 72 000-card header take seconds.
        FitsInputStream in = new FitsInputStream(new ByteArrayInputStream(
                all.toString().getBytes(StandardCharsets.US_ASCII)));
        int total = images.size();
        for (int i = 0; i < total; i++) {
            HeaderCard hc;
            try {
                if (in.available() <= 0) {
                    break;
                }
                hc = new HeaderCard(in);
            } catch (IOException | RuntimeException e) {
                throw new FitsException(Kind.BAD_DATA, file, index, null, "header card " + (i + 1)
                        + " cannot be parsed (" + oneLine(e.getMessage()) + "), so the header is damaged "
                        + "(re-export the file from the program that made it)", e);
            }
            if (hc.isBlank()) {
                // Blank cards are padding (FITS 4.0 §4.4.2.4 allows them anywhere); they carry nothing.
                continue;
            }
            String key = hc.getKey() == null ? "" : hc.getKey().trim();
            if (open != null && key.equals("CONTINUE") && hc.isStringValue()) {
                longValue.append(stripAmpersand(hc.getValue()));
                appendComment(longComment, hc.getComment());
                if (!endsWithAmpersand(hc.getValue())) {
                    cards.add(longCard(open, longValue, longComment));
                    open = null;
                }
                continue;
            }
            if (open != null) {
                cards.add(longCard(open, longValue, longComment));
                open = null;
            }
            if (hc.isStringValue() && endsWithAmpersand(hc.getValue())) {
                open = hc;
                longValue = new StringBuilder(stripAmpersand(hc.getValue()));
                longComment = new StringBuilder();
                appendComment(longComment, hc.getComment());
                keyed.putIfAbsent(key, hc);
                continue;
            }
            keyed.putIfAbsent(key, hc);
            cards.add(toCard(hc));
        }
        if (open != null) {
            cards.add(longCard(open, longValue, longComment));
        }
        return new Parsed(cards, keyed);
    }

    private static boolean endsWithAmpersand(String v) {
        return v != null && v.stripTrailing().endsWith("&");
    }

    private static String stripAmpersand(String v) {
        String t = v.stripTrailing();
        return t.endsWith("&") ? t.substring(0, t.length() - 1) : v;
    }

    private static void appendComment(StringBuilder sb, String comment) {
        if (comment != null && !comment.isBlank()) {
            sb.append(sb.length() > 0 ? " " : "").append(comment.strip());
        }
    }

    private static Card longCard(HeaderCard first, StringBuilder value, StringBuilder comment) {
        String key = ascii(first.getKey().trim());
        return new Card(key, "'" + ascii(value.toString()).replace("'", "''") + "'",
                comment.length() == 0 ? null : ascii(comment.toString()));
    }

    private HduInfo validate(int index, Parsed h) throws FitsException {
        List<Card> cards = h.cards();
        String xt;
        if (index == 0) {
            HeaderCard simple = h.keyed().get("SIMPLE");
            if (simple == null || !"T".equals(String.valueOf(simple.getValue()).trim())) {
                throw bad(0, "SIMPLE", "SIMPLE is not T, so the file declares that it does not conform to "
                        + "FITS (convert it with the program that made it)");
            }
            xt = "PRIMARY";
        } else {
            HeaderCard x = h.keyed().get("XTENSION");
            xt = x == null || x.getValue() == null ? "" : x.getValue().trim().toUpperCase(Locale.ROOT);
        }
        long bitpixL = integer(h, index, "BITPIX", true, 0);
        int bitpix = (int) bitpixL;
        if (bitpixL != bitpix || !(bitpix == 8 || bitpix == 16 || bitpix == 32 || bitpix == 64
                || bitpix == -32 || bitpix == -64)) {
            throw bad(index, "BITPIX", "BITPIX is " + bitpixL + ", which is not one of the legal values 8, "
                    + "16, 32, 64, -32, -64 (the file is damaged or not FITS; re-export it)");
        }
        long naxis = integer(h, index, "NAXIS", true, 0);
        if (naxis < 0 || naxis > MAX_NAXIS) {
            throw bad(index, "NAXIS", "NAXIS is " + naxis + ", outside the legal range 0 to 999 "
                    + "(the file is damaged; re-export it)");
        }
        long[] axes = new long[(int) naxis];
        for (int i = 0; i < naxis; i++) {
            String key = "NAXIS" + (i + 1);
            axes[i] = integer(h, index, key, true, 0);
            if (axes[i] < 0) {
                throw bad(index, key, key + " is " + axes[i] + ", a negative axis length "
                        + "(the file is damaged; re-export it)");
            }
        }
        boolean groups = index == 0 && naxis >= 1 && axes[0] == 0 && logical(h, "GROUPS");
        long pcount = index == 0 && !groups ? 0 : integer(h, index, "PCOUNT", false, 0);
        long gcount = index == 0 && !groups ? 1 : integer(h, index, "GCOUNT", false, 1);
        if (pcount < 0 || gcount < 0) {
            throw bad(index, pcount < 0 ? "PCOUNT" : "GCOUNT", "PCOUNT/GCOUNT is negative "
                    + "(the file is damaged; re-export it)");
        }
        long dataBytes;
        try {
            long count = naxis == 0 ? 0 : 1;
            for (int i = groups ? 1 : 0; i < naxis; i++) {
                count = Math.multiplyExact(count, axes[i]);
            }
            if (naxis > 0 || pcount > 0) {
                count = Math.multiplyExact(gcount, Math.addExact(pcount, count));
            }
            dataBytes = Math.multiplyExact(count, Math.abs(bitpix) / 8);
            Math.addExact(dataBytes, BLOCK);
        } catch (ArithmeticException e) {
            throw bad(index, "NAXIS", "the header declares a data size (" + describeAxes(axes)
                    + ") too large to exist, so it is damaged (re-export the file)");
        }
        if (fileLength >= 0 && dataBytes > fileLength - position) {
            throw new FitsException(Kind.BAD_DATA, file, index, null, "the data unit declares " + dataBytes
                    + " bytes (" + describeAxes(axes) + ", BITPIX " + bitpix + ") but only "
                    + Math.max(0, fileLength - position) + " bytes follow the header, so the file is "
                    + "truncated (copy it again from its source)");
        }
        Type type;
        if (groups) {
            type = Type.OTHER;
        } else if (index == 0 || xt.equals("IMAGE") || xt.equals("IUEIMAGE")) {
            type = dataBytes == 0 ? Type.EMPTY : Type.IMAGE;
        } else if (xt.equals("BINTABLE") && logical(h, "ZIMAGE")) {
            type = Type.COMPRESSED_IMAGE;
        } else {
            type = Type.OTHER;
        }
        return new HduInfo(index, type, xt, bitpix, axes, dataBytes, cards, Map.copyOf(h.keyed()));
    }

    private static boolean logical(Parsed h, String key) {
        HeaderCard c = h.keyed().get(key);
        return c != null && !c.isStringValue() && c.getValue() != null && c.getValue().trim().equals("T");
    }

    private long integer(Parsed h, int index, String key, boolean required, long dflt) throws FitsException {
        HeaderCard c = h.keyed().get(key);
        if (c == null || c.getValue() == null || c.getValue().isBlank()) {
            if (required) {
                throw bad(index, key, "the mandatory keyword " + key + " is missing, so the header is not "
                        + "valid FITS (the file is damaged or not FITS; re-export it)");
            }
            return dflt;
        }
        String v = c.getValue().trim();
        try {
            if (c.isStringValue()) {
                throw new NumberFormatException();
            }
            return Long.parseLong(v.startsWith("+") ? v.substring(1) : v);
        } catch (NumberFormatException e) {
            throw bad(index, key, key + " is '" + v + "', not an integer (the file is damaged; re-export it)");
        }
    }

    /**
     * Converts one nom-tam-fits card to ours.
     *
     * @param c the card (input, not modified)
     * @return our card: quoted string value, raw number/logical text, or null value for commentary
     */
    public static Card toCard(HeaderCard c) {
        String key = c.getKey() == null ? "" : ascii(c.getKey().trim());
        String comment = c.getComment() == null ? null : ascii(c.getComment());
        String value = c.getValue();
        if (c.isCommentStyleCard() || value == null || (!c.isStringValue() && value.isBlank())) {
            if (value != null && !value.isBlank() && comment == null) {
                comment = ascii(value);
            }
            return new Card(key, null, comment);
        }
        if (c.isStringValue()) {
            return new Card(key, "'" + ascii(value).replace("'", "''") + "'", comment);
        }
        return new Card(key, ascii(value.trim()), comment);
    }

    private static String ascii(String s) {
        StringBuilder sb = null;
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c < 0x20 || c > 0x7E) {
                if (sb == null) {
                    sb = new StringBuilder(s.substring(0, i));
                }
                sb.append('?');
            } else if (sb != null) {
                sb.append(c);
            }
        }
        return sb == null ? s : sb.toString();
    }

    /** @return "NAXIS1 × NAXIS2 = 100 × 200" style text */
    public static String describeAxes(long[] axes) {
        if (axes.length == 0) {
            return "NAXIS = 0";
        }
        StringBuilder a = new StringBuilder();
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < axes.length; i++) {
            a.append(i > 0 ? " x " : "").append("NAXIS").append(i + 1);
            b.append(i > 0 ? " x " : "").append(axes[i]);
        }
        return a + " = " + b;
    }

    private static boolean startsWith(byte[] block, String s) {
        byte[] p = s.getBytes(StandardCharsets.US_ASCII);
        if (block.length < p.length) {
            return false;
        }
        for (int i = 0; i < p.length; i++) {
            if (block[i] != p[i]) {
                return false;
            }
        }
        return true;
    }

    private static boolean allBlank(byte[] b, int off, int len) {
        for (int i = off; i < off + len; i++) {
            if (b[i] != ' ') {
                return false;
            }
        }
        return true;
    }

    private static String oneLine(String s) {
        return s == null ? "no detail" : s.replaceAll("\\s+", " ").trim();
    }

    private FitsException bad(int hdu, String keyword, String message) {
        return new FitsException(Kind.BAD_DATA, file, hdu, keyword, message);
    }

}
