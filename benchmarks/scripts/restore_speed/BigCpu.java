import dev.nitid.fits.FitsReader;
import dev.nitid.image.Image;
import dev.nitid.restore.*;
import java.lang.management.ManagementFactory;
import java.nio.file.Path;

/**
 * Process CPU time of restorations of a large frame, for comparing builds (any jar with the public restore
 * API, e.g. main's and a branch's): run with Java's source launcher,
 * {@code java -Xmx3g -cp cli/target/nitid.jar benchmarks/scripts/restore_speed/BigCpu.java FRAME.fits PSF.fits
 * ITERATIONS METHOD...}. Each METHOD (a {@code Method} name) runs the defaults with exactly ITERATIONS
 * iterations, twice; CPU time is less disturbed than wall time when other jobs share the machine.
 */
public class BigCpu {
    public static void main(String[] a) throws Exception {
        Image frame = FitsReader.read(Path.of(a[0])).image();
        Image psf = FitsReader.read(Path.of(a[1])).image();
        int it = Integer.parseInt(a[2]);
        var os = (com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean();
        for (int r = 0; r < 2; r++) {
            for (int m = 3; m < a.length; m++) {
                RestoreSettings s = RestoreSettings.defaults().withMethod(Method.valueOf(a[m])).withIterations(it);
                s = s.withStopping(s.stopping().withRecordLikelihood(false));
                long c0 = os.getProcessCpuTime(), t0 = System.nanoTime();
                RestorationResult res = Restorers.create(s).restore(frame, psf);
                long c1 = os.getProcessCpuTime(), t1 = System.nanoTime();
                PlaneReport p = res.planes().get(0);
                System.out.printf("%s %d it: wall %.2f s (setup %.2f), process CPU %.2f s, %.0f ms CPU/it%n", a[m], p.iterations(),
                        (t1 - t0) / 1e9, p.setupNanos() / 1e9, (c1 - c0) / 1e9, ((c1 - c0) / 1e6) / it);
            }
        }
    }
}
