package dev.nitid.bench.fft;

import dev.nitid.fft.Boundary;
import dev.nitid.fft.ConvolutionSettings;
import dev.nitid.fft.Convolver;
import dev.nitid.fft.Tiling;
import dev.nitid.image.Image;
import java.lang.management.ManagementFactory;
import java.util.SplittableRandom;

/**
 * A plain best-of-N wall-clock timer of one convolution, for {@code compare.sh}, which runs it in the
 * same session as scipy.fft and FFTW on the same work. (JMH is the reference for our own figures; this
 * exists so that the three timings are taken the same way, back to back.)
 *
 * <p>Usage: {@code java -cp benchmarks.jar dev.nitid.bench.fft.ConvolveTiming W H PSF THREADS TILING REPS}
 */
public final class ConvolveTiming {
    private ConvolveTiming() {
    }

    /**
     * Runs the timing and prints one line: sizes, the path chosen, the best wall time in ms, the
     * smallest process CPU time of one call in ms (all threads; meaningful when the machine is shared)
     * and a checksum.
     *
     * @param args width, height, PSF side, threads, tiling (WHOLE_PLANE, TILED, AUTO), repetitions
     */
    public static void main(String[] args) {
        int w = Integer.parseInt(args[0]);
        int h = Integer.parseInt(args[1]);
        int p = Integer.parseInt(args[2]);
        int threads = Integer.parseInt(args[3]);
        Tiling tiling = Tiling.valueOf(args[4]);
        int reps = Integer.parseInt(args[5]);
        Image psf = Image.create(p, p);
        psf.fill(1f / (p * p));
        float[] in = new float[w * h];
        float[] out = new float[w * h];
        SplittableRandom rnd = new SplittableRandom(1);
        for (int i = 0; i < in.length; i++) {
            in[i] = (float) rnd.nextDouble();
        }
        try (Convolver c = Convolver.create(w, h, psf, new ConvolutionSettings(Boundary.REFLECT, threads, tiling))) {
            var os = (com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean();
            double best = Double.POSITIVE_INFINITY;
            double bestCpu = Double.POSITIVE_INFINITY;
            // Two untimed calls let the JIT compile the kernels.
            for (int r = -2; r < reps; r++) {
                long c0 = os.getProcessCpuTime();
                long t0 = System.nanoTime();
                c.convolve(in, out);
                double ms = (System.nanoTime() - t0) / 1e6;
                double cpu = (os.getProcessCpuTime() - c0) / 1e6;
                if (r >= 0) {
                    best = Math.min(best, ms);
                    bestCpu = Math.min(bestCpu, cpu);
                }
            }
            double sum = 0;
            for (float v : out) {
                sum += v;
            }
            System.out.printf("nitid %s %dx%d fft %dx%d threads %d best_ms %.2f cpu_ms %.2f checksum %.6e%n",
                    c.tiled() ? "tiled" : "whole", w, h, c.fftWidth(), c.fftHeight(), threads, best, bestCpu,
                    sum / in.length);
        }
    }
}
