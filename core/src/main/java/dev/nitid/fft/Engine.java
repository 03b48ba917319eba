package dev.nitid.fft;

/** One way of running a {@link Convolver}'s plan: the whole padded plane, or overlap-save tiles. */
interface Engine extends AutoCloseable {
    void convolve(float[] in, float[] out);

    void correlate(float[] in, float[] out);

    int fftWidth();

    int fftHeight();

    @Override
    void close();
}
