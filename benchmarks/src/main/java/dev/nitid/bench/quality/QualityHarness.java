package dev.nitid.bench.quality;

import dev.nitid.image.Image;
import dev.nitid.restore.Method;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import dev.nitid.restore.StarProtection;
import dev.nitid.restore.Stopping;
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
 * Builds each scene, writes {@code OUT_DIR/SCENE/{observed,truth,psf}.npy} (and each restoration as
 * {@code OUT_DIR/SCENE/METHOD.npy}), runs
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
        m.add(new Entry("defaults (" + describe(d) + ")", d));
        // the other iterative methods with the previous default rule (χ²/N = 1, cap 100), for comparison
        RestoreSettings chi1 = d.withStopping(Stopping.chiSquare());
        m.add(new Entry("accelerated RL, " + describe(chi1.withMethod(Method.ACCELERATED_RL)).replaceFirst("^[^,]*, ", ""),
                chi1.withMethod(Method.ACCELERATED_RL)));
        m.add(new Entry("TV-RL, " + describe(chi1).replaceFirst("^[^,]*, ", "") + " (previous default)",
                chi1.withMethod(Method.TV_RL)));
        m.add(new Entry("damped RL, " + describe(chi1).replaceFirst("^[^,]*, ", ""), chi1.withMethod(Method.DAMPED_RL)));
        m.add(new Entry("Wiener (K estimated)", d.withMethod(Method.WIENER)));
        m.add(new Entry("Tikhonov", d.withMethod(Method.TIKHONOV)));
        return m;
    }

    /**
     * @param args {@code [OUT_DIR] [--no-python] [--scene seeing|diffraction] [--only TEXT]
     *             [--score SCENE FILE.npy]}: {@code --only} keeps the methods whose name contains TEXT
     *             (repeatable); {@code --score} prints the input's row and the given restoration's row only
     * @throws Exception on I/O failure
     */
    public static void main(String[] args) throws Exception {
        Path out = Path.of("benchmarks/target/quality");
        boolean python = true;
        String scene = null;
        List<String> only = new ArrayList<>();
        Path score = null;
        for (int i = 0; i < args.length; i++) {
            switch (args[i]) {
                case "--no-python" -> python = false;
                case "--scene" -> scene = args[++i];
                case "--only" -> only.add(args[++i].toLowerCase(Locale.ROOT));
                case "--score" -> {
                    scene = args[++i];
                    score = Path.of(args[++i]);
                }
                default -> out = Path.of(args[i]);
            }
        }
        if (scene != null && !scene.equals("seeing") && !scene.equals("diffraction")) {
            throw new IllegalArgumentException("--scene is '" + scene + "': use seeing or diffraction");
        }
        Options opt = new Options(out, python && score == null, only, score);
        PrintStream o = System.out;
        if (scene == null || scene.equals("seeing")) {
            run("seeing", "seeing-limited Moffat FWHM 4 px, beta 3", Scenes.seeing(), opt, o);
        }
        if (scene == null || scene.equals("diffraction")) {
            run("diffraction", "diffraction-limited obstructed Airy (eps 0.33, 4 vanes), 2.4 px per lambda/D",
                    Scenes.diffraction(), opt, o);
        }
    }

    /** What to run: output folder, scikit-image or not, method filters, an outside restoration to score. */
    record Options(Path out, boolean python, List<String> only, Path score) {
        boolean wants(String method) {
            if (score != null) {
                return false;
            }
            String m = method.toLowerCase(Locale.ROOT);
            return only.isEmpty() || only.stream().anyMatch(m::contains);
        }
    }

    static void run(String name, String title, FieldSettings settings, Options opt, PrintStream o)
            throws IOException, InterruptedException {
        Path out = opt.out();
        boolean python = opt.python();
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
        // a perfect restoration puts the light the aperture misses back into the star: judge flux against that
        double ideal = QualityReference.idealFluxRatio(f.psf(), ref.apertureRadius());
        o.printf(Locale.ROOT, "Flux aperture r = %.1f px holds %.1f %% of the PSF's light: a perfect restoration "
                + "scores a flux ratio of %.3f; the \"flux / ideal\" column divides by it.%n%n",
                ref.apertureRadius(), 100 / ideal, ideal);
        o.println("| method | iterations (stop) | FWHM ratio | ring depth (sigma) | error vs truth | flux ratio | flux / ideal | noise ratio | time (s) |");
        o.println("|---|---|---:|---:|---:|---:|---:|---:|---:|");
        row(o, "input (no restoration)", "-", ref.evaluate(f.observed()), 0, ideal);
        if (opt.score() != null) {
            row(o, opt.score().getFileName().toString(), "?", ref.evaluate(Npy.read(opt.score())), 0, ideal);
        }
        for (Entry m : methods()) {
            if (!opt.wants(m.name())) {
                continue;
            }
            long t = System.nanoTime();
            RestorationResult r = Restorers.create(m.settings()).restore(f.observed(), f.psf());
            double secs = (System.nanoTime() - t) / 1e9;
            String it = m.settings().method().iterative() ? r.iterations() + " (" + r.stopReason() + ")" : "-";
            row(o, m.name(), it, ref.evaluate(r.image()), secs, ideal);
            Npy.write(dir.resolve(slug(m.name()) + ".npy"), r.image());
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
                        ref.evaluate(Npy.read(result)), secs, ideal);
            } else {
                o.println("| scikit-image RL | (failed: " + log.replace('\n', ' ') + ") | | | | | | | |");
            }
        }
    }

    /** @return "method, stopping rule, star guard" of a setting, so that the table labels follow the defaults */
    static String describe(RestoreSettings s) {
        return s.method().name().toLowerCase(Locale.ROOT).replace('_', '-') + ", "
                + s.stopping().rule().name().toLowerCase(Locale.ROOT).replace('_', ' ')
                + String.format(Locale.ROOT, " %s, cap %d", s.stopping().threshold(), s.stopping().maxIterations()) + ", guard "
                + s.protection().guard().name().toLowerCase(Locale.ROOT).replace('_', ' ');
    }

    /** @return a file-name form of a method name: lower case, runs of other characters as one '-' */
    static String slug(String name) {
        return name.toLowerCase(Locale.ROOT).replaceAll("[^a-z0-9]+", "-").replaceAll("^-|-$", "");
    }

    /** The interpreter with Debian's scipy/scikit-image: {@code $NITID_PYTHON}, else /usr/bin/python3, else python3. */
    static String python() {
        String env = System.getenv("NITID_PYTHON");
        if (env != null && !env.isBlank()) {
            return env;
        }
        return Files.isExecutable(Path.of("/usr/bin/python3")) ? "/usr/bin/python3" : "python3";
    }

    static void row(PrintStream o, String name, String iterations, QualityReport r, double seconds, double ideal) {
        o.printf(Locale.ROOT, "| %s | %s | %.3f | %.2f | %.3f | %.3f | %.3f | %.3f | %.2f |%n", name, iterations, r.fwhmRatio(),
                r.ringDepth(), r.errorRatio(), r.fluxRatio(), r.fluxRatio() / ideal, r.noiseRatio(), seconds);
    }
}
