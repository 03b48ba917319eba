package dev.nitid.fft;

/**
 * How a {@link Convolver} extends the image and how many threads it uses.
 *
 * @param boundary how the image is extended beyond its edges
 * @param threads  worker threads, ≥ 1; results are identical whatever the count
 */
public record ConvolutionSettings(Boundary boundary, int threads) {

    /** Validates the settings. */
    public ConvolutionSettings {
        if (boundary == null) {
            throw new IllegalArgumentException("boundary is null: choose ZERO, REFLECT or PERIODIC");
        }
        if (threads < 1) {
            throw new IllegalArgumentException("threads is " + threads + ": use at least 1");
        }
    }

    /** @return reflective boundary on all available cores: the safe default for astronomical images */
    public static ConvolutionSettings defaults() {
        return new ConvolutionSettings(Boundary.REFLECT, Runtime.getRuntime().availableProcessors());
    }

    /** @return these settings with another boundary */
    public ConvolutionSettings withBoundary(Boundary b) {
        return new ConvolutionSettings(b, threads);
    }

    /** @return these settings with another thread count */
    public ConvolutionSettings withThreads(int n) {
        return new ConvolutionSettings(boundary, n);
    }
}
