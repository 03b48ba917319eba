package dev.nitid.fft;

/**
 * How a {@link Convolver} extends the image, how many threads it uses, and whether it works in tiles.
 *
 * @param boundary how the image is extended beyond its edges
 * @param threads  worker threads, ≥ 1; results are bit-identical whatever the count
 * @param tiling   whole plane, overlap-save tiles, or chosen by the measured rule ({@link Tiling#AUTO})
 */
public record ConvolutionSettings(Boundary boundary, int threads, Tiling tiling) {

    /** Validates the settings. */
    public ConvolutionSettings {
        if (boundary == null) {
            throw new IllegalArgumentException("boundary is null: choose ZERO, REFLECT or PERIODIC");
        }
        if (threads < 1) {
            throw new IllegalArgumentException("threads is " + threads + ": use at least 1");
        }
        if (tiling == null) {
            throw new IllegalArgumentException("tiling is null: choose AUTO, WHOLE_PLANE or TILED");
        }
    }

    /**
     * Settings with the tiling chosen automatically.
     *
     * @param boundary how the image is extended beyond its edges
     * @param threads  worker threads, ≥ 1
     */
    public ConvolutionSettings(Boundary boundary, int threads) {
        this(boundary, threads, Tiling.AUTO);
    }

    /** @return reflective boundary on all available cores, automatic tiling: the safe default for astronomical images */
    public static ConvolutionSettings defaults() {
        return new ConvolutionSettings(Boundary.REFLECT, Runtime.getRuntime().availableProcessors(), Tiling.AUTO);
    }

    /** @return these settings with another boundary */
    public ConvolutionSettings withBoundary(Boundary b) {
        return new ConvolutionSettings(b, threads, tiling);
    }

    /** @return these settings with another thread count */
    public ConvolutionSettings withThreads(int n) {
        return new ConvolutionSettings(boundary, n, tiling);
    }

    /** @return these settings with another tiling choice */
    public ConvolutionSettings withTiling(Tiling t) {
        return new ConvolutionSettings(boundary, threads, t);
    }
}
