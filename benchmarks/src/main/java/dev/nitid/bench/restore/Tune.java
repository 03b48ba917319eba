package dev.nitid.bench.restore;

import dev.nitid.psf.PupilPsf;
import dev.nitid.quality.QualityReference;
import dev.nitid.quality.QualityReport;
import dev.nitid.quality.QualitySettings;
import dev.nitid.restore.Method;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import dev.nitid.restore.StarProtection;
import dev.nitid.restore.Stopping;
import dev.nitid.synth.DetectorSettings;
import dev.nitid.synth.ExtendedSettings;
import dev.nitid.synth.FieldGenerator;
import dev.nitid.synth.FieldSettings;
import dev.nitid.synth.FluxLaw;
import dev.nitid.synth.ImagePsf;
import dev.nitid.synth.SyntheticModelPsf;
import dev.nitid.synth.Placement;
import dev.nitid.synth.StarSettings;
import dev.nitid.synth.SyntheticField;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;

/**
 * Tuning runs of the restore settings on the quality harness's two scenes (the same settings as
 * {@code dev.nitid.bench.quality.Scenes}, rebuilt here because that class is package-private):
 * {@code java -cp benchmarks.jar dev.nitid.bench.restore.Tune [seeing|diffraction|both]}.
 */
public final class Tune {
    private Tune() {
    }

    static FieldSettings scene(String name) {
        StarSettings stars = new StarSettings(300, FluxLaw.POWER_LAW, 150, 2e6, 0.7, Placement.RANDOM, 12);
        ExtendedSettings ext = new ExtendedSettings(200, 14, 60, 1.2, 3, 300);
        DetectorSettings det = new DetectorSettings(200, 1.5, 6, 4, Double.POSITIVE_INFINITY);
        if (name.equals("seeing")) {
            return new FieldSettings(512, 512, 20261201L, stars, ext, SyntheticModelPsf.moffat(4.0, 3.0).withSize(63), det);
        }
        PupilPsf pupil = PupilPsf.ofSampling(1 / 2.4, 550).withObstruction(0.33).withVanes(4, 0.015 * 100, 0);
        return new FieldSettings(512, 512, 20261202L, stars, ext,
                ImagePsf.of(pupil.render(101, 3, 0, 0), "pupil"), det);
    }

    /**
     * @param args scene names
     */
    public static void main(String[] args) {
        String[] scenes = args.length == 0 || args[0].equals("both") ? new String[] {"seeing", "diffraction"} : args;
        RestoreSettings d = RestoreSettings.defaults();
        Map<String, RestoreSettings> m = new LinkedHashMap<>();
        String which = System.getProperty("tune.set", "default");
        for (String entry : which.split(";")) {
            m.put(entry, parse(d, entry));
        }
        for (String s : scenes) {
            SyntheticField f = FieldGenerator.generate(scene(s));
            QualityReference ref = QualityReference.of(f, QualitySettings.defaults());
            System.out.printf(Locale.ROOT, "%s: input FWHM %.2f, sigma %.2f%n", s, ref.inputFwhm(), ref.inputSigma());
            for (Map.Entry<String, RestoreSettings> e : m.entrySet()) {
                long t = System.nanoTime();
                RestorationResult r = Restorers.create(e.getValue()).restore(f.observed(), f.psf());
                QualityReport q = ref.evaluate(r.image());
                System.out.printf(Locale.ROOT, "  %-40s it %3d %-20s fwhm %.3f ring %6.2f err %.3f flux %.3f noise %.3f %5.1fs%n",
                        e.getKey(), r.iterations(), r.stopReason(), q.fwhmRatio(), q.ringDepth(), q.errorRatio(),
                        q.fluxRatio(), q.noiseRatio(), (System.nanoTime() - t) / 1e9);
                if (Boolean.getBoolean("tune.history")) {
                    StringBuilder b = new StringBuilder("    chi2/change:");
                    for (var rec : r.planes().get(0).history()) {
                        b.append(String.format(Locale.ROOT, " %d:%.3f/%.1e", rec.iteration(), rec.chiSquare(), rec.relativeChange()));
                    }
                    System.out.println(b);
                }
            }
        }
    }

    /** Parses "key=value,key=value" over the defaults: m=RL|ACC|TV|ATV|DAMPED, it=N, chi=T (keeps the cap), cap=N, g=ring|sky|none, marg, det, rad, tv, damp. */
    static RestoreSettings parse(RestoreSettings d, String spec) {
        RestoreSettings s = d;
        StarProtection p = d.protection();
        if (spec.equals("default")) {
            return d;
        }
        for (String kv : spec.split(",")) {
            String[] a = kv.split("=");
            switch (a[0]) {
                case "m" -> s = s.withMethod(switch (a[1]) {
                    case "RL" -> Method.RICHARDSON_LUCY;
                    case "ACC" -> Method.ACCELERATED_RL;
                    case "TV" -> Method.TV_RL;
                    case "ATV" -> Method.ACCELERATED_TV_RL;
                    case "W" -> Method.WIENER;
                    default -> Method.DAMPED_RL;
                });
                case "it" -> s = s.withIterations(Integer.parseInt(a[1]));
                case "cap" -> s = s.withStopping(s.stopping().withMaxIterations(Integer.parseInt(a[1])));
                case "chi" -> s = s.withStopping(Stopping.chiSquare().withThreshold(Double.parseDouble(a[1]))
                        .withMaxIterations(s.stopping().rule() == dev.nitid.restore.StopRule.CHI_SQUARE
                                ? s.stopping().maxIterations() : Stopping.DEFAULT_CAP));
                case "g" -> p = switch (a[1]) {
                    case "ring" -> StarProtection.ringFloor();
                    case "sky" -> StarProtection.skyFloor();
                    default -> StarProtection.none();
                };
                case "marg" -> p = p.withMarginSigma(Double.parseDouble(a[1]));
                case "det" -> p = p.withDetectSigma(Double.parseDouble(a[1]));
                case "rad" -> p = p.withRadiusFactor(Double.parseDouble(a[1]));
                case "tv" -> s = s.withTvWeight(Double.parseDouble(a[1]));
                case "damp" -> s = s.withDampingSigma(Double.parseDouble(a[1]));
                default -> throw new IllegalArgumentException("unknown key " + a[0]);
            }
        }
        return s.withProtection(p);
    }
}
