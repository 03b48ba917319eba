package dev.nitid.fits;

import dev.nitid.fits.FitsException.Kind;
import dev.nitid.fits.internal.SafeOutput;
import dev.nitid.image.Image;
import java.awt.Transparency;
import java.awt.color.ColorSpace;
import java.awt.image.BufferedImage;
import java.awt.image.ColorModel;
import java.awt.image.ComponentColorModel;
import java.awt.image.DataBuffer;
import java.awt.image.Raster;
import java.awt.image.WritableRaster;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.channels.Channels;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Hashtable;
import java.util.Iterator;
import javax.imageio.IIOImage;
import javax.imageio.ImageIO;
import javax.imageio.ImageReader;
import javax.imageio.ImageWriter;
import javax.imageio.stream.ImageInputStream;
import javax.imageio.stream.ImageOutputStream;

/**
 * 32-bit float and 16-bit TIFF export and import through the JDK's own ImageIO TIFF plugin
 * ({@code com.sun.imageio.plugins.tiff}, part of Java since 9). The JDK plugin is chosen by class name, so an
 * ImageIO plugin on the class path that registers another TIFF writer (some cannot write float samples)
 * is never used.
 *
 * <p><b>Row order.</b> FITS stores the bottom row first (image row {@code y = 0} is FITS row 1, drawn at the
 * bottom); TIFF stores the top row first. So TIFF row {@code r} holds image row {@code height − 1 − r}, on
 * export and on import: an image looks the same way up in a FITS viewer and in a TIFF viewer, and a
 * FITS → TIFF → FITS round trip returns the original rows.
 *
 * <p>Planes: 1 (grey, PhotometricInterpretation BlackIsZero) or 3 (RGB), samples pixel-interleaved,
 * uncompressed. Float export is bit-exact; 16-bit export rounds to nearest and clips to 0..65535 like
 * {@link FitsWriter}. Import accepts any sample type the plugin decodes (8/16/32-bit integer, 32/64-bit float)
 * and returns the samples as float32 without scaling.
 *
 * <p>Stateless; thread-safe.
 */
public final class TiffIo {
    private static final String JDK_PLUGIN = "com.sun.imageio.plugins.tiff.";
    private static final double HEAP_SHARE = 0.9;

    private TiffIo() {
    }

    /**
     * Reads the first image of a TIFF file.
     *
     * @param file the file (input, not modified)
     * @return the samples as float32, one plane per sample, bottom row first
     * @throws FitsException if the file is missing, unreadable, not a TIFF the JDK plugin decodes, or too large
     */
    public static Image read(Path file) throws FitsException {
        if (Files.isDirectory(file)) {
            throw new FitsException(Kind.UNREADABLE, file, -1, null, "this is a folder, not a file (give a TIFF file)");
        }
        if (!Files.exists(file)) {
            throw new FitsException(Kind.NOT_FOUND, file, -1, null, "the file does not exist (check the name and the folder)");
        }
        ImageReader reader = jdkReader(file);
        try (ImageInputStream in = ImageIO.createImageInputStream(file.toFile())) {
            if (in == null) {
                throw new FitsException(Kind.UNREADABLE, file, -1, null, "the file cannot be opened (check its permissions)");
            }
            reader.setInput(in, true, true);
            int w = reader.getWidth(0);
            int h = reader.getHeight(0);
            int bands = reader.getRawImageType(0) == null ? 1
                    : reader.getRawImageType(0).getSampleModel().getNumBands();
            if (bands < 1 || bands > FitsReader.MAX_PLANES) {
                throw new FitsException(Kind.BAD_DATA, file, -1, null, "the TIFF has " + bands
                        + " samples per pixel, but 1 to " + FitsReader.MAX_PLANES + " are handled (save it as grey or RGB)");
            }
            long need = 8L * w * h * bands;
            long max = Runtime.getRuntime().maxMemory();
            if ((long) w * h > Integer.MAX_VALUE - 8 || need > HEAP_SHARE * max) {
                throw new FitsException(Kind.TOO_LARGE, file, -1, null, "the TIFF (" + w + " x " + h + " x " + bands
                        + ") needs about " + (need >> 20) + " MiB but the Java heap is limited to " + (max >> 20)
                        + " MiB (raise the heap with -Xmx, or crop the image)");
            }
            Raster raster = reader.read(0).getRaster();  // the JDK plugin cannot readRaster()
            Image img = Image.create(w, h, bands);
            float[] row = new float[w];
            for (int b = 0; b < bands; b++) {
                float[] plane = img.plane(b);
                for (int r = 0; r < h; r++) {
                    raster.getSamples(raster.getMinX(), raster.getMinY() + r, w, 1, b, row);
                    System.arraycopy(row, 0, plane, (h - 1 - r) * w, w);
                }
            }
            return img;
        } catch (AccessDeniedException e) {
            throw new FitsException(Kind.UNREADABLE, file, -1, null, "permission to read the file is denied (check its permissions)", e);
        } catch (NoSuchFileException e) {
            throw new FitsException(Kind.NOT_FOUND, file, -1, null, "the file does not exist (check the name and the folder)", e);
        } catch (IOException | RuntimeException e) {
            throw new FitsException(Kind.BAD_DATA, file, -1, null, "the TIFF cannot be decoded (" + e.getMessage()
                    + ") (check that it is a complete, uncompressed or standard-compressed TIFF)", e);
        } catch (OutOfMemoryError e) {
            throw new FitsException(Kind.TOO_LARGE, file, -1, null, "the TIFF does not fit in the Java heap "
                    + "(raise the heap with -Xmx, or crop the image)", e);
        } finally {
            reader.dispose();
        }
    }

    /**
     * Writes an image as TIFF: {@code options.bitpix()} −32 gives float32 samples (SampleFormat 3), 16 gives
     * unsigned 16-bit samples; overwrite and protected inputs work as for {@link FitsWriter}.
     *
     * @param file    the output path
     * @param image   1 (grey) or 3 (RGB) planes (input, not modified)
     * @param options −32 or 16, overwrite policy, protected inputs
     * @return the path written, clipped pixel count and whether rounding occurred (16-bit only)
     * @throws FitsException if the output exists (without overwrite), would replace an input, cannot be
     *                       created or writing fails
     * @throws IllegalArgumentException if the plane count or the output type is not supported
     */
    public static WriteReport write(Path file, Image image, WriteOptions options) throws FitsException {
        if (image.planes() != 1 && image.planes() != 3) {
            throw new IllegalArgumentException("the image has " + image.planes()
                    + " planes but TIFF export handles 1 (grey) or 3 (RGB): export planes one by one");
        }
        if (options.bitpix() != -32 && options.bitpix() != 16) {
            throw new IllegalArgumentException("TIFF output type " + options.bitpix()
                    + " is not supported: use -32 (float32) or 16 (unsigned 16-bit)");
        }
        boolean f32 = options.bitpix() == -32;
        int w = image.width();
        int h = image.height();
        int bands = image.planes();
        int type = f32 ? DataBuffer.TYPE_FLOAT : DataBuffer.TYPE_USHORT;
        ColorModel cm = new ComponentColorModel(ColorSpace.getInstance(bands == 1 ? ColorSpace.CS_GRAY
                : ColorSpace.CS_sRGB), false, false, Transparency.OPAQUE, type);
        WritableRaster raster = cm.createCompatibleWritableRaster(w, h);
        long clipped = 0;
        boolean rounded = false;
        for (int b = 0; b < bands; b++) {
            float[] plane = image.plane(b);
            for (int r = 0; r < h; r++) {
                int src = (h - 1 - r) * w;
                for (int x = 0; x < w; x++) {
                    float v = plane[src + x];
                    if (f32) {
                        raster.setSample(x, r, b, v);
                    } else {
                        double q = Float.isNaN(v) ? 0 : Math.rint(v);
                        rounded |= !Float.isNaN(v) && q != v;
                        if (Float.isNaN(v) || q < 0 || q > 65535) {
                            clipped++;
                            q = Math.max(0, Math.min(65535, q));
                        }
                        raster.setSample(x, r, b, (int) q);
                    }
                }
            }
        }
        BufferedImage bi = new BufferedImage(cm, raster, false, new Hashtable<>());
        ImageWriter writer = jdkWriter();
        try {
            SafeOutput.write(file, options.overwrite(), options.protectedInputs(), ch -> {
                OutputStream os = Channels.newOutputStream(ch);
                try (ImageOutputStream out = ImageIO.createImageOutputStream(os)) {
                    writer.setOutput(out);
                    writer.write(null, new IIOImage(bi, null, null), writer.getDefaultWriteParam());
                    out.flush();
                }
                os.flush();
            });
        } finally {
            writer.dispose();
        }
        return new WriteReport(file, clipped, rounded);
    }

    private static ImageReader jdkReader(Path file) throws FitsException {
        Iterator<ImageReader> it = ImageIO.getImageReadersByFormatName("tiff");
        while (it.hasNext()) {
            ImageReader r = it.next();
            if (r.getClass().getName().startsWith(JDK_PLUGIN)) {
                return r;
            }
        }
        throw new IllegalStateException("the JDK's TIFF reader (" + JDK_PLUGIN + ") is missing: use Java 9 or later");
    }

    private static ImageWriter jdkWriter() {
        Iterator<ImageWriter> it = ImageIO.getImageWritersByFormatName("tiff");
        while (it.hasNext()) {
            ImageWriter w = it.next();
            if (w.getClass().getName().startsWith(JDK_PLUGIN)) {
                return w;
            }
        }
        throw new IllegalStateException("the JDK's TIFF writer (" + JDK_PLUGIN + ") is missing: use Java 9 or later");
    }
}
