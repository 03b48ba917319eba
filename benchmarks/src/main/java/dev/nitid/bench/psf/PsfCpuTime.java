package dev.nitid.bench.psf;

import dev.nitid.psf.PsfModel;
import dev.nitid.psf.PupilPsf;
import dev.nitid.psf.Spectrum;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.Arrays;
import java.util.Locale;
import java.util.concurrent.ForkJoinPool;

/**
 * CPU time of the target render on one thread, which a loaded shared machine does not inflate as it
 * does wall-clock time: the render runs inside a one-thread fork-join pool and the worker's own CPU clock
 * (ThreadMXBean) is read around it. On two idle cores the wall time is at most this figure (the rows and
 * columns of the pupil FFT split evenly over the pool).
 *
 * <pre>
 * java -cp benchmarks/target/benchmarks.jar dev.nitid.bench.psf.PsfCpuTime [runs]
 * </pre>
 */
public final class PsfCpuTime {
    private PsfCpuTime() {
    }

    /**
     * Prints min and median CPU ms per render for f = 1000 and 2000 mm.
     *
     * @param args optional run count (default 15; the first 5 are warm-up)
     * @throws Exception if a render fails
     */
    public static void main(String[] args) throws Exception {
        int runs = args.length > 0 ? Integer.parseInt(args[0]) : 15;
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        ForkJoinPool one = new ForkJoinPool(1);
        try {
            for (double f : new double[] {1000, 2000}) {
                PsfModel m = PupilPsf.of(200, f, 3.76, Spectrum.band(500, 600, 5)).withObstruction(0.33)
                        .withVanes(4, 2, 0);
                double[] cpu = new double[runs];
                double[] wall = new double[runs];
                for (int i = 0; i < runs; i++) {
                    final int k = i;
                    one.submit(() -> {
                        long w0 = System.nanoTime();
                        long c0 = mx.getCurrentThreadCpuTime();
                        m.render(129, 5, 0, 0);
                        cpu[k] = (mx.getCurrentThreadCpuTime() - c0) / 1e6;
                        wall[k] = (System.nanoTime() - w0) / 1e6;
                    }).get();
                }
                double[] c = Arrays.copyOfRange(cpu, Math.min(5, runs - 1), runs);
                double[] w = Arrays.copyOfRange(wall, Math.min(5, runs - 1), runs);
                Arrays.sort(c);
                Arrays.sort(w);
                System.out.printf(Locale.ROOT, "airy band 129^2 os 5, f %.0f mm, 1 thread: CPU min %.0f ms, median %.0f ms;"
                        + " wall min %.0f ms, median %.0f ms (%d runs after warm-up)%n", f, c[0], c[c.length / 2],
                        w[0], w[w.length / 2], c.length);
            }
        } finally {
            one.shutdown();
        }
    }
}
