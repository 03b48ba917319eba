/**
 * The FFT engine: {@link dev.nitid.fft.RealFft2d}, a 2-D real-to-complex transform plan for any size
 * (its Javadoc holds the one description of the spectrum packing and normalisation), and
 * {@link dev.nitid.fft.Convolver}, a plan that convolves images of one size with one PSF and applies the
 * exact adjoint without allocating per call (its Javadoc holds the PSF-centre rule), on the whole padded
 * plane or in overlap-save tiles ({@link dev.nitid.fft.Tiling}); fast transform sizes
 * ({@link dev.nitid.fft.FftSizes}) and boundary handling ({@link dev.nitid.fft.Boundary}).
 * Results never depend on the thread count.
 */
package dev.nitid.fft;
