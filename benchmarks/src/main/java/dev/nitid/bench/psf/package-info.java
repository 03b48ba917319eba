/**
 * PSF rendering benchmarks: JMH {@code PsfRenderBenchmark} (analytic models and the obstructed, spidered
 * pupil over a band) and {@code PsfCpuTime}, a load-independent CPU-time check of the same render.
 */
package dev.nitid.bench.psf;
