/**
 * Benchmarks of the FFT convolution engine: the JMH {@link dev.nitid.bench.fft.ConvolveBenchmark} and
 * {@link dev.nitid.bench.fft.ConvolveTiming}, the plain timer that
 * {@code benchmarks/scripts/convolution/compare.sh} runs beside scipy.fft and FFTW.
 */
package dev.nitid.bench.fft;
