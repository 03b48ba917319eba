package dev.nitid.bench.quality;

import dev.nitid.image.Image;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Reads and writes 2-D arrays in NumPy's {@code .npy} format, version 1.0 (the format is specified in
 * NumPy's {@code numpy/lib/format.py} documentation): magic {@code \x93NUMPY}, version bytes, a little-endian
 * 16-bit header length, an ASCII dict padded with spaces to a multiple of 64 bytes ending in a newline, then
 * the data in C order. Only {@code <f4} and {@code <f8} are read; {@code <f4} is written.
 */
final class Npy {
    private static final byte[] MAGIC = {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y'};

    private Npy() {
    }

    static void write(Path file, Image img) throws IOException {
        String dict = "{'descr': '<f4', 'fortran_order': False, 'shape': (" + img.height() + ", " + img.width() + "), }";
        int base = MAGIC.length + 2 + 2;
        int total = base + dict.length() + 1;
        int padded = (total + 63) / 64 * 64;
        StringBuilder h = new StringBuilder(dict);
        h.append(" ".repeat(padded - total)).append('\n');
        byte[] header = h.toString().getBytes(StandardCharsets.US_ASCII);
        ByteBuffer buf = ByteBuffer.allocate(base + header.length + 4 * img.pixelCount()).order(ByteOrder.LITTLE_ENDIAN);
        buf.put(MAGIC).put((byte) 1).put((byte) 0).putShort((short) header.length).put(header);
        for (float v : img.plane(0)) {
            buf.putFloat(v);
        }
        Files.write(file, buf.array());
    }

    static Image read(Path file) throws IOException {
        ByteBuffer buf = ByteBuffer.wrap(Files.readAllBytes(file)).order(ByteOrder.LITTLE_ENDIAN);
        for (byte b : MAGIC) {
            if (buf.get() != b) {
                throw new IOException(file + ": not a .npy file");
            }
        }
        int major = buf.get();
        buf.get();
        int hlen = major == 1 ? Short.toUnsignedInt(buf.getShort()) : buf.getInt();
        byte[] hb = new byte[hlen];
        buf.get(hb);
        String header = new String(hb, StandardCharsets.US_ASCII);
        Matcher shape = Pattern.compile("'shape': \\((\\d+), (\\d+)\\)").matcher(header);
        Matcher descr = Pattern.compile("'descr': '([<>|]\\w\\d)'").matcher(header);
        if (!shape.find() || !descr.find() || header.contains("'fortran_order': True")) {
            throw new IOException(file + ": expected a C-order 2-D array, header " + header.trim());
        }
        int h = Integer.parseInt(shape.group(1));
        int w = Integer.parseInt(shape.group(2));
        Image img = Image.create(w, h);
        float[] px = img.plane(0);
        switch (descr.group(1)) {
            case "<f4" -> {
                for (int i = 0; i < px.length; i++) {
                    px[i] = buf.getFloat();
                }
            }
            case "<f8" -> {
                for (int i = 0; i < px.length; i++) {
                    px[i] = (float) buf.getDouble();
                }
            }
            default -> throw new IOException(file + ": dtype " + descr.group(1) + " not supported (use float32/64)");
        }
        return img;
    }
}
