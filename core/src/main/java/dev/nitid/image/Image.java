package dev.nitid.image;

import java.util.Arrays;

/**
 * A float32 image of {@code planes × height × width} pixels, one flat row-major array per plane.
 *
 * <p>Pixel {@code (x, y)} of plane {@code p} is {@code plane(p)[y * width + x]}. Row {@code y = 0} is the
 * first row in memory; in a FITS file it is the first row stored (NAXIS2 = 1), which FITS viewers draw at
 * the bottom. Colour images are cubes with one plane per channel (1 to 4 planes are common).
 *
 * <p>Pixels are {@code float}; every sum or statistic is accumulated in {@code double}
 * (see {@link ImageStats}). NaN marks an undefined pixel and is kept as such.
 *
 * <p>Not thread-safe for concurrent writes; concurrent reads are safe. The arrays returned by
 * {@link #plane(int)} are the image's own storage, not copies: kernels work on them directly.
 */
public final class Image {
    private final int width;
    private final int height;
    private final float[][] planes;

    private Image(int width, int height, float[][] planes) {
        this.width = width;
        this.height = height;
        this.planes = planes;
    }

    /**
     * Creates a zero-filled image.
     *
     * @param width  columns, ≥ 1
     * @param height rows, ≥ 1
     * @param planes planes, ≥ 1
     * @return a new image
     * @throws IllegalArgumentException if a dimension is not positive or the plane is larger than 2³¹−1 pixels
     */
    public static Image create(int width, int height, int planes) {
        checkShape(width, height);
        if (planes < 1) {
            throw new IllegalArgumentException("planes is " + planes + ": an image needs at least 1 plane");
        }
        float[][] data = new float[planes][];
        for (int p = 0; p < planes; p++) {
            data[p] = new float[width * height];
        }
        return new Image(width, height, data);
    }

    /** Creates a zero-filled single-plane image; see {@link #create(int, int, int)}. */
    public static Image create(int width, int height) {
        return create(width, height, 1);
    }

    /**
     * Wraps existing arrays without copying them.
     *
     * @param width  columns, ≥ 1
     * @param height rows, ≥ 1
     * @param planes one array of exactly {@code width * height} pixels per plane (input, kept by reference)
     * @return an image over those arrays
     * @throws IllegalArgumentException if an array has the wrong length or no plane is given
     */
    public static Image wrap(int width, int height, float[]... planes) {
        checkShape(width, height);
        if (planes == null || planes.length == 0) {
            throw new IllegalArgumentException("no plane given: pass at least one float[] of width*height pixels");
        }
        for (int p = 0; p < planes.length; p++) {
            if (planes[p] == null || planes[p].length != width * height) {
                throw new IllegalArgumentException("plane " + p + " has "
                        + (planes[p] == null ? "no array" : planes[p].length + " pixels")
                        + " but the image is " + width + "x" + height + " = " + (width * height)
                        + ": pass one array of width*height pixels per plane");
            }
        }
        return new Image(width, height, planes.clone());
    }

    private static void checkShape(int width, int height) {
        if (width < 1 || height < 1) {
            throw new IllegalArgumentException("image size " + width + "x" + height
                    + " is not positive: width and height must be at least 1");
        }
        if ((long) width * height > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("image size " + width + "x" + height
                    + " exceeds 2^31 pixels per plane: process it in regions");
        }
    }

    /** @return number of columns (FITS NAXIS1) */
    public int width() {
        return width;
    }

    /** @return number of rows (FITS NAXIS2) */
    public int height() {
        return height;
    }

    /** @return number of planes (FITS NAXIS3, or 1) */
    public int planes() {
        return planes.length;
    }

    /** @return pixels per plane, {@code width * height} */
    public int pixelCount() {
        return width * height;
    }

    /**
     * The storage of one plane, row-major, not a copy (output, may be modified by the caller).
     *
     * @param p plane index, 0-based
     * @return the plane's array
     */
    public float[] plane(int p) {
        checkPlane(p);
        return planes[p];
    }

    /**
     * A single-plane image sharing plane {@code p}'s storage.
     *
     * @param p plane index, 0-based
     * @return a view of that plane
     */
    public Image planeImage(int p) {
        checkPlane(p);
        return new Image(width, height, new float[][] {planes[p]});
    }

    /** Pixel {@code (x, y)} of plane 0, bounds-checked. */
    public float get(int x, int y) {
        return get(0, x, y);
    }

    /** Pixel {@code (x, y)} of plane {@code p}, bounds-checked. */
    public float get(int p, int x, int y) {
        checkPlane(p);
        checkXY(x, y);
        return planes[p][y * width + x];
    }

    /** Sets pixel {@code (x, y)} of plane 0, bounds-checked. */
    public void set(int x, int y, float value) {
        set(0, x, y, value);
    }

    /** Sets pixel {@code (x, y)} of plane {@code p}, bounds-checked. */
    public void set(int p, int x, int y, float value) {
        checkPlane(p);
        checkXY(x, y);
        planes[p][y * width + x] = value;
    }

    /** @return a deep copy */
    public Image copy() {
        float[][] data = new float[planes.length][];
        for (int p = 0; p < planes.length; p++) {
            data[p] = planes[p].clone();
        }
        return new Image(width, height, data);
    }

    /**
     * @param other another image
     * @return true if both have the same width, height and plane count
     */
    public boolean sameShape(Image other) {
        return other.width == width && other.height == height && other.planes.length == planes.length;
    }

    /** Statistics of plane {@code p}; see {@link ImageStats#of(float[])}. */
    public ImageStats stats(int p) {
        return ImageStats.of(plane(p));
    }

    /** Fills every plane with {@code value}. */
    public void fill(float value) {
        for (float[] plane : planes) {
            Arrays.fill(plane, value);
        }
    }

    private void checkPlane(int p) {
        if (p < 0 || p >= planes.length) {
            throw new IndexOutOfBoundsException("plane " + p + " outside 0.." + (planes.length - 1));
        }
    }

    private void checkXY(int x, int y) {
        if (x < 0 || x >= width || y < 0 || y >= height) {
            throw new IndexOutOfBoundsException("pixel (" + x + ", " + y + ") outside the "
                    + width + "x" + height + " image");
        }
    }

    @Override
    public String toString() {
        return "Image[" + width + "x" + height + (planes.length > 1 ? "x" + planes.length : "") + "]";
    }
}
