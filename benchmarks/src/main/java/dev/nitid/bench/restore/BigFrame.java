package dev.nitid.bench.restore;

import dev.nitid.fits.FitsReader;
import dev.nitid.image.Image;
import dev.nitid.restore.IterationRecord;
import dev.nitid.restore.PlaneReport;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import java.nio.file.Path;
import java.util.Locale;

/**
 * Times one restoration of a large frame with a given PSF, stage by stage and iteration by iteration:
 * {@code java -Dtune.set=SPEC -cp benchmarks.jar dev.nitid.bench.restore.BigFrame FRAME.fits PSF.fits [REPEATS]},
 * where SPEC is a {@link Tune} setting ("default", or "m=ATV,it=30", ...).
 */
public final class BigFrame {
    private BigFrame() {
    }

    /**
     * @param args frame, PSF, optional repeat count
     * @throws Exception on a bad file
     */
    public static void main(String[] args) throws Exception {
        Image frame = FitsReader.read(Path.of(args[0])).image();
        Image psf = FitsReader.read(Path.of(args[1])).image();
        int repeats = args.length > 2 ? Integer.parseInt(args[2]) : 1;
        RestoreSettings s = Tune.parse(RestoreSettings.defaults(), System.getProperty("tune.set", "default"));
        s = s.withStopping(s.stopping().withRecordLikelihood(false)); // as the CLI does without -v
        for (int r = 0; r < repeats; r++) {
            long t0 = System.nanoTime();
            RestorationResult res = Restorers.create(s).restore(frame, psf);
            long t1 = System.nanoTime();
            PlaneReport p = res.planes().get(0);
            System.out.printf(Locale.ROOT, "%dx%d psf %dx%d %s: %d it (%s), total %.2f s, setup %.2f s, iterations %.2f s (%.0f ms/it)%n",
                    frame.width(), frame.height(), psf.width(), psf.height(), s.method(), p.iterations(), p.stopReason(),
                    (t1 - t0) / 1e9, p.setupNanos() / 1e9, p.iterationNanos() / 1e9,
                    p.iterationNanos() / 1e6 / Math.max(1, p.iterations()));
            if (Boolean.getBoolean("tune.history")) {
                StringBuilder b = new StringBuilder("  chi2/change:");
                for (IterationRecord rec : p.history()) {
                    b.append(String.format(Locale.ROOT, " %d:%.3f/%.1e", rec.iteration(), rec.chiSquare(), rec.relativeChange()));
                }
                System.out.println(b);
            }
        }
    }
}
