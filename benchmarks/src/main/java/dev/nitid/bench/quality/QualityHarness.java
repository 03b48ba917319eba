package dev.nitid.bench.quality;

import dev.nitid.image.Image;
import dev.nitid.restore.Method;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import dev.nitid.restore.StarProtection;
import dev.nitid.quality.QualityReference;
import dev.nitid.quality.QualityReport;
import dev.nitid.quality.QualitySettings;
import dev.nitid.synth.FieldGenerator;
import dev.nitid.synth.FieldSettings;
import dev.nitid.synth.SyntheticField;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * The quality harness's entry point.
 *
 * <pre>
 * java -cp benchmarks/target/benchmarks.jar dev.nitid.bench.quality.QualityHarness [OUT_DIR] [--no-python]
 * </pre>
 * Builds each scene, writes {@code OUT_DIR/SCENE/{observed,truth,psf}.npy}, runs
 * {@code benchmarks/scripts/quality/skimage_rl.py OUT_DIR/SCENE} with {@link #python()} (scikit-image's RL, 30 iterations, clip off),
 * restores with every setting listed in {@link #methods()} (the {@code dev.nitid.restore} methods on main), and
 * prints one table per scene on stdout.
 */
public final class QualityHarness {
    /** Iterations of the fixed-count runs: the count the scikit-image figures use. */
    static final int ITERATIONS = 30;

    private QualityHarness() {
    }

    /** A named restoration setting, run on a scene's observed image with its true PSF. */
    record Entry(String name, RestoreSettings settings) {
    }

    /** @return the restorations in the table: add a line here to add a row */
    static List<Entry> methods() {
        RestoreSettings d = RestoreSettings.defaults();
        RestoreSettings plain = d.withMethod(Method.RICHARDSON_LUCY).withIterations(ITERATIONS);
        List<Entry> m = new ArrayList<>();
        m.add(new Entry("plain RL, 30 it, no protection", plain.withProtection(StarProtection.none())));
        m.add(new Entry("plain RL, 30 it, sky floor", plain.withProtection(StarProtection.skyFloor())));
        m.add(new Entry("plain RL, 30 it, ring floor", plain.withProtection(StarProtection.ringFloor())));
        m.add(new Entry("defaults (accelerated RL, auto stop, ring floor)", d));
        m.add(new Entry("TV-RL, auto stop, ring floor", d.withMethod(Method.TV_RL)));
        m.add(new Entry("damped RL, auto stop, ring floor", d.withMethod(Method.DAMPED_RL)));
        m.add(new Entry("Wiener (K estimated)", d.withMethod(Method.WIENER)));
        m.add(new Entry("Tikhonov", d.withMethod(Method.TIKHONOV)));
        return m;
    }

    /**
     * @param args output folder (default {@code target/quality}) and {@code --no-python} to skip scikit-image
     * @throws Exception on I/O failure
     */
    public static void main(String[] args) throws Exception {
        Path out = Path.of("benchmarks/target/quality");
        boolean python = true;
        for (String a : args) {
            if (a.equals("--no-python")) {
                python = false;
            } else {
                out = Path.of(a);
            }
        }
        PrintStream o = System.out;
        run("seeing", "seeing-limited Moffat FWHM 4 px, beta 3", Scenes.seeing(), out, python, o);
        run("diffraction", "diffraction-limited obstructed Airy (eps 0.33, 4 vanes), 2.4 px per lambda/D",
                Scenes.diffraction(), out, python, o);
    }

    static void run(String name, String title, FieldSettings settings, Path out, boolean python, PrintStream o)
            throws IOException, InterruptedException {
        long t0 = System.nanoTime();
        SyntheticField f = FieldGenerator.generate(settings);
        QualityReference ref = QualityReference.of(f, QualitySettings.defaults());
        double build = (System.nanoTime() - t0) / 1e9;
        Path dir = out.resolve(name);
        Files.createDirectories(dir);
        Npy.write(dir.resolve("observed.npy"), f.observed());
        Npy.write(dir.resolve("truth.npy"), f.truth());
        Npy.write(dir.resolve("psf.npy"), f.psf());

        o.printf(Locale.ROOT, "%n### Scene \"%s\": %s%n%n", name, title);
        o.printf(Locale.ROOT, "%dx%d px, %d stars, seed %d; input sky sigma %.2f ADU, input star FWHM %.2f px; "
                        + "%d stars for FWHM/flux, %d for rings, %d nebula px; scene built in %.1f s%n%n",
                f.observed().width(), f.observed().height(), f.catalogue().size(), settings.seed(),
                ref.inputSigma(), ref.inputFwhm(), ref.fwhmStars().size(), ref.ringStars().size(),
                ref.nebulaPixels(), build);
        o.println("| method | iterations (stop) | FWHM ratio | ring depth (sigma) | error vs truth | flux ratio | noise ratio | time (s) |");
        o.println("|---|---|---:|---:|---:|---:|---:|---:|");
        row(o, "input (no restoration)", "-", ref.evaluate(f.observed()), 0);
        for (Entry m : methods()) {
            long t = System.nanoTime();
            RestorationResult r = Restorers.create(m.settings()).restore(f.observed(), f.psf());
            double secs = (System.nanoTime() - t) / 1e9;
            String it = m.settings().method().iterative() ? r.iterations() + " (" + r.stopReason() + ")" : "-";
            row(o, m.name(), it, ref.evaluate(r.image()), secs);
        }
        if (python) {
            Path script = Path.of("benchmarks/scripts/quality/skimage_rl.py");
            Process p = new ProcessBuilder(python(), script.toString(), dir.toString(), String.valueOf(ITERATIONS))
                    .redirectErrorStream(true).start();
            String log = new String(p.getInputStream().readAllBytes()).trim();
            int code = p.waitFor();
            Path result = dir.resolve("skimage_rl.npy");
            if (code == 0 && Files.exists(result)) {
                double secs = Double.parseDouble(Files.readString(dir.resolve("skimage_rl.seconds")).trim());
                row(o, "scikit-image " + log + " richardson_lucy (clip=False)", String.valueOf(ITERATIONS),
                        ref.evaluate(Npy.read(result)), secs);
            } else {
                o.println("| scikit-image RL | (failed: " + log.replace('\n', ' ') + ") | | | | | | |");
            }
        }
    }

    /** The interpreter with Debian's scipy/scikit-image: {@code $NITID_PYTHON}, else /usr/bin/python3, else python3. */
    static String python() {
        String env = System.getenv("NITID_PYTHON");
        if (env != null && !env.isBlank()) {
            return env;
        }
        return Files.isExecutable(Path.of("/usr/bin/python3")) ? "/usr/bin/python3" : "python3";
    }

    static void row(PrintStream o, String name, String iterations, QualityReport r, double seconds) {
        o.printf(Locale.ROOT, "| %s | %s | %.3f | %.2f | %.3f | %.3f | %.3f | %.2f |%n", name, iterations, r.fwhmRatio(),
                r.ringDepth(), r.errorRatio(), r.fluxRatio(), r.noiseRatio(), seconds);
    }
}
