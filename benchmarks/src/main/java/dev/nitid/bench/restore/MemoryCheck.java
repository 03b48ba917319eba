package dev.nitid.bench.restore;

import dev.nitid.image.Image;
import dev.nitid.restore.Method;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import java.util.Locale;
import java.util.SplittableRandom;

/**
 * The memory check of issue 5: {@code java -Xmx400m -cp benchmarks.jar dev.nitid.bench.restore.MemoryCheck
 * [size] [psf] [iterations] [method]} restores a {@code size²} frame with a {@code psf²} PSF for a fixed
 * number of iterations through the public API and prints the time and the heap high-water mark it saw.
 */
public final class MemoryCheck {
    private MemoryCheck() {
    }

    /**
     * @param args size (4096), PSF side (65), iterations (40), method (RICHARDSON_LUCY)
     */
    public static void main(String[] args) {
        int size = args.length > 0 ? Integer.parseInt(args[0]) : 4096;
        int psfSize = args.length > 1 ? Integer.parseInt(args[1]) : 65;
        int iters = args.length > 2 ? Integer.parseInt(args[2]) : 40;
        Method method = args.length > 3 ? Method.valueOf(args[3]) : Method.RICHARDSON_LUCY;
        SplittableRandom rnd = new SplittableRandom(1);
        Image img = Image.create(size, size);
        float[] a = img.plane(0);
        for (int i = 0; i < a.length; i++) {
            a[i] = (float) (100 + 10 * rnd.nextDouble());
        }
        for (int s = 0; s < 500; s++) {
            a[rnd.nextInt(a.length)] += 50000f;
        }
        Image psf = Image.create(psfSize, psfSize);
        int c = psfSize / 2;
        double sigma = psfSize / 8.0;
        for (int y = 0; y < psfSize; y++) {
            for (int x = 0; x < psfSize; x++) {
                psf.set(x, y, (float) Math.exp(-((x - c) * (x - c) + (y - c) * (y - c)) / (2 * sigma * sigma)));
            }
        }
        long[] peak = {0};
        Runtime rt = Runtime.getRuntime();
        long t0 = System.nanoTime();
        RestorationResult r = Restorers.create(RestoreSettings.defaults().withMethod(method).withIterations(iters)
                .withThreads(2)).restore(img, psf, rec -> peak[0] = Math.max(peak[0], rt.totalMemory() - rt.freeMemory()),
                () -> false);
        double sec = (System.nanoTime() - t0) / 1e9;
        System.out.printf(Locale.ROOT, "%dx%d, PSF %dx%d, %s, %d iterations: %.1f s (%.0f ms/iteration), "
                        + "heap max %d MiB, used at iterations up to %d MiB%n", size, size, psfSize, psfSize, method,
                r.iterations(), sec, r.planes().get(0).iterationNanos() / 1e6 / Math.max(1, r.iterations()),
                rt.maxMemory() >> 20, peak[0] >> 20);
    }
}
