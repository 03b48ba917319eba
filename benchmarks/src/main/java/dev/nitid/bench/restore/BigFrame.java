package dev.nitid.bench.restore;

import dev.nitid.fits.FitsReader;
import dev.nitid.image.Image;
import dev.nitid.quality.ObservedQuality;
import dev.nitid.quality.QualityReport;
import dev.nitid.quality.QualitySettings;
import dev.nitid.restore.IterationRecord;
import dev.nitid.restore.PlaneReport;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import dev.nitid.stars.MeasureSettings;
import dev.nitid.stars.StarMeasurement;
import dev.nitid.stars.StarMeasurer;
import java.nio.file.Path;
import java.util.Locale;

/**
 * Times restorations of a large frame (or a crop of it) with a given PSF and prints the figures that
 * {@code nitid sharpen} prints (FWHM ratio, worst ring, flux kept, sky-noise ratio, from
 * {@link ObservedQuality}):
 * {@code java -Dtune.set="SPEC;SPEC" -cp benchmarks.jar dev.nitid.bench.restore.BigFrame FRAME.fits PSF.fits [X0 Y0 W H]},
 * where SPEC is a {@link Tune} setting ("default", "m=TV,chi=1,cap=100", "cap=50", ...). The likelihood is not
 * recorded, as in the CLI without {@code -v}.
 */
public final class BigFrame {
    private BigFrame() {
    }

    /**
     * @param args frame, PSF, optional crop
     * @throws Exception on a bad file
     */
    public static void main(String[] args) throws Exception {
        Image frame = FitsReader.read(Path.of(args[0])).image();
        Image psf = FitsReader.read(Path.of(args[1])).image();
        if (args.length >= 6) {
            int x0 = Integer.parseInt(args[2]);
            int y0 = Integer.parseInt(args[3]);
            int w = Integer.parseInt(args[4]);
            int h = Integer.parseInt(args[5]);
            Image c = Image.create(w, h);
            for (int y = 0; y < h; y++) {
                System.arraycopy(frame.plane(0), (y0 + y) * frame.width() + x0, c.plane(0), y * w, w);
            }
            frame = c;
        }
        RestoreSettings base = RestoreSettings.defaults();
        StarMeasurement stars = StarMeasurer.measure(frame, MeasureSettings.defaults().withThreads(base.threads()));
        ObservedQuality check = ObservedQuality.of(frame, stars, Double.NaN, QualitySettings.defaults(), base.threads());
        for (String spec : System.getProperty("tune.set", "default").split(";")) {
            RestoreSettings s = Tune.parse(base, spec);
            s = s.withStopping(s.stopping().withRecordLikelihood(false));
            long t0 = System.nanoTime();
            RestorationResult res = Restorers.create(s).restore(frame, psf);
            long t1 = System.nanoTime();
            PlaneReport p = res.planes().get(0);
            QualityReport q = check.evaluate(res.image());
            System.out.printf(Locale.ROOT, "%-28s %dx%d %s: %3d it (%s) fwhm %.3f ring %.2f flux %.4f noise %.3f;"
                            + " restore %.2f s (setup %.2f, %.0f ms/it)%n",
                    spec, frame.width(), frame.height(), s.method(), p.iterations(), p.stopReason(), q.fwhmRatio(),
                    q.ringDepth(), q.fluxRatio(), q.noiseRatio(), (t1 - t0) / 1e9, p.setupNanos() / 1e9,
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
