package dev.nitid.cli;

import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.WriteOptions;
import dev.nitid.fits.WriteReport;
import dev.nitid.restore.EdgeHandling;
import dev.nitid.restore.Method;
import dev.nitid.restore.PlaneReport;
import dev.nitid.restore.ProgressListener;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import dev.nitid.restore.StarProtection;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code nitid sharpen IN.fits --psf PSF.fits -o OUT.fits}: restores detail by deconvolution with a given PSF.
 * Parses, builds {@link RestoreSettings}, calls {@link Restorers}, writes the result with the input header
 * plus HISTORY and parameter cards.
 */
@Command(name = "sharpen", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Restores detail in an image by deconvolution with its PSF (Richardson-Lucy with a light",
            "total-variation regulariser by default, with protection against dark rings around bright stars",
            "and an automatic stop when the residual reaches the noise).",
            "",
            "Deconvolved images are for viewing and morphology, not for photometry, unless the",
            "restoration has been validated for that purpose."},
        footerHeading = "%nOutput:%n",
        footer = {"The output keeps the input header and adds HISTORY cards and these parameter cards:",
            "  NTDMETH  method, NTDITER iterations run, NTDSTOP why it stopped, NTDEDGE edge handling,",
            "  NTDGUARD star protection, NTDPSF PSF file name."})
public final class SharpenCommand implements Callable<Integer> {
    /** The method names the command accepts. */
    enum MethodName {
        /** Richardson-Lucy with total-variation regularisation, the default. */
        rl,
        /** Wiener filter, one pass. */
        wiener
    }

    /** Edge handling names. */
    enum EdgeName {
        /** mirrored edges (default). */
        reflect,
        /** restore on a larger domain than the frame (Bertero and Boccacci 2005). */
        extended,
        /** circular. */
        periodic,
        /** dark outside. */
        zero
    }

    /** Star protection names. */
    enum GuardName {
        /** annulus means kept above the local sky (default). */
        rings,
        /** every pixel kept above the local sky. */
        pixels,
        /** no protection. */
        none
    }

    @Spec
    CommandSpec spec;

    @Mixin
    CommonOptions common;

    @Parameters(index = "0", paramLabel = "IN.fits", description = "The image to sharpen (one plane or a colour cube).")
    Path input;

    @Option(names = "--psf", required = true, paramLabel = "PSF.fits",
            description = "The PSF: one plane for all image planes, or a cube with one PSF per plane. Its centre is "
                    + "pixel (floor(w/2), floor(h/2)); it is normalised to unit sum.")
    Path psfFile;

    @Option(names = {"-o", "--output"}, required = true, paramLabel = "OUT.fits", description = "Where to write the result (float32).")
    Path output;

    @Option(names = "--method", paramLabel = "rl|wiener", description = "rl (default) or wiener.")
    MethodName method = MethodName.rl;

    @Option(names = "--iterations", paramLabel = "N",
            description = "Run exactly N Richardson-Lucy iterations. Default: stop automatically when the residual "
                    + "reaches the noise (at most 100).")
    Integer iterations;

    @Option(names = "--overwrite", description = "Replace OUT.fits if it exists.")
    boolean overwrite;

    @Option(names = "--saturation", paramLabel = "LEVEL",
            description = "Pixels at or above LEVEL are ignored and filled by the restoration. Default: the "
                    + "header's SATURATE card, else the ceiling of an integer data type.")
    Double saturation;

    @Option(names = "--edges", paramLabel = "MODE", description = "Edge handling: reflect (default), extended, periodic or zero.")
    EdgeName edges = EdgeName.reflect;

    @Option(names = "--star-guard", paramLabel = "KIND",
            description = "Protection against dark rings around bright stars: rings (default), pixels or none.")
    GuardName guard = GuardName.rings;

    @Override
    public Integer call() {
        return Failures.run(spec, common, () -> {
            if (iterations != null && iterations < 1) {
                throw new IllegalArgumentException("--iterations is " + iterations
                        + ", but at least 1 iteration is needed (give a positive count or leave it out)");
            }
            if (saturation != null && !(saturation > 0) ) {
                throw new IllegalArgumentException("--saturation is " + saturation
                        + ", but a saturation level must be a positive number (or leave it out)");
            }
            FitsImage in = FitsReader.read(input);
            FitsImage psf = FitsReader.read(psfFile);
            RestoreSettings s = settings(in);
            PrintWriter err = spec.commandLine().getErr();
            ProgressListener listener = common.verbose()
                    ? r -> err.printf(Locale.ROOT, "plane %d iteration %d: log-likelihood %.6g, chi2/N %.4g, change %.3g%n",
                            r.plane(), r.iteration(), r.logLikelihood(), r.chiSquare(), r.relativeChange())
                    : ProgressListener.NONE;
            if (psf.image().planes() != 1 && psf.image().planes() != in.image().planes()) {
                throw new IllegalArgumentException(psfFile + " has " + psf.image().planes() + " planes but "
                        + input + " has " + in.image().planes()
                        + " (give one PSF for all planes or one PSF per plane)");
            }
            RestorationResult r = Restorers.create(s).restore(in.image(), psf.image(), listener, () -> false);
            FitsHeader h = header(in.header(), s, r);
            WriteReport wr = FitsWriter.write(output, r.image(), h,
                    WriteOptions.defaults().withOverwrite(overwrite).withProtectedInputs(input, psfFile));
            if (!common.quiet()) {
                PrintWriter out = spec.commandLine().getOut();
                for (int p = 0; p < r.planes().size(); p++) {
                    PlaneReport pr = r.planes().get(p);
                    out.printf(Locale.ROOT, "plane %d: %s, %d iterations (%s), %d masked pixels, %d protected stars%n",
                            p, methodText(s.method()), pr.iterations(), stopText(pr), pr.maskedPixels(),
                            pr.protectedStars());
                }
                out.printf(Locale.ROOT, "wrote %s%n", wr.file());
                out.flush();
            }
            return ExitCode.OK;
        });
    }

    private RestoreSettings settings(FitsImage in) {
        RestoreSettings s = RestoreSettings.defaults().withThreads(common.threads());
        if (method == MethodName.wiener) {
            s = s.withMethod(Method.WIENER);
        }
        if (iterations != null) {
            s = s.withIterations(iterations);
        }
        // the likelihood costs a logarithm per pixel; only --verbose shows it
        s = s.withStopping(s.stopping().withRecordLikelihood(common.verbose()));
        s = s.withEdges(switch (edges) {
            case reflect -> EdgeHandling.REFLECT;
            case extended -> EdgeHandling.EXTENDED_DOMAIN;
            case periodic -> EdgeHandling.PERIODIC;
            case zero -> EdgeHandling.ZERO;
        });
        s = s.withProtection(switch (guard) {
            case rings -> StarProtection.ringFloor();
            case pixels -> StarProtection.skyFloor();
            case none -> StarProtection.none();
        });
        OptionalDouble level = saturation != null ? OptionalDouble.of(saturation) : headerSaturation(in);
        if (level.isPresent()) {
            s = s.withSaturation(level.getAsDouble());
        }
        return s;
    }

    /**
     * The SATURATE card (common practice, no source), else the largest value of an integer data type
     * (FITS Standard 4.0, Table 8 and §5.3: physical = BZERO + BSCALE·stored).
     */
    static OptionalDouble headerSaturation(FitsImage in) {
        OptionalDouble sat = in.header().getDouble("SATURATE");
        if (sat.isPresent() && sat.getAsDouble() > 0) {
            return sat;
        }
        double bzero = in.header().getDouble("BZERO").orElse(0);
        double bscale = in.header().getDouble("BSCALE").orElse(1);
        double stored = switch (in.bitpix()) {
            case 8 -> 255;
            case 16 -> 32767;
            case 32 -> 2147483647.0;
            default -> Double.NaN;
        };
        if (Double.isNaN(stored) || !(bscale > 0)) {
            return OptionalDouble.empty();
        }
        return OptionalDouble.of(bzero + bscale * stored);
    }

    private FitsHeader header(FitsHeader h, RestoreSettings s, RestorationResult r) {
        PlaneReport p0 = r.planes().get(0);
        String psfName = psfFile.getFileName().toString();
        h = h.withHistory("nitid " + NitidCommand.toolVersion() + " sharpen: " + methodText(s.method()) + ", "
                + p0.iterations() + " iterations (" + stopText(p0) + "), edges " + edges + ", star guard " + guard
                + ", PSF " + psfName);
        h = h.withHistory("Deconvolved image: for viewing and morphology, not photometry unless validated.");
        h = h.with("NTDMETH", s.method().name(), "restoration method");
        h = h.with("NTDITER", (long) p0.iterations(), "iterations run (plane 0)");
        h = h.with("NTDSTOP", p0.stopReason().name(), "why the iterations stopped");
        h = h.with("NTDEDGE", s.edges().name(), "edge handling");
        h = h.with("NTDGUARD", s.protection().guard().name(), "star-ringing protection");
        h = h.with("NTDPSF", psfName.length() > 60 ? psfName.substring(0, 60) : psfName, "PSF file");
        return h;
    }

    private static String methodText(Method m) {
        return switch (m) {
            case ACCELERATED_RL -> "accelerated Richardson-Lucy";
            case RICHARDSON_LUCY -> "Richardson-Lucy";
            case TV_RL -> "TV-regularised Richardson-Lucy";
            case DAMPED_RL -> "damped Richardson-Lucy";
            case WIENER -> "Wiener filter";
            case TIKHONOV -> "Tikhonov filter";
        };
    }

    private static String stopText(PlaneReport p) {
        return switch (p.stopReason()) {
            case FIXED_COUNT_REACHED -> "as requested";
            case CHI_SQUARE_REACHED -> "residual reached the noise";
            case LIKELIHOOD_CONVERGED -> "likelihood stopped improving";
            case STALLED -> "estimate stopped changing";
            case ITERATION_CAP -> "iteration cap reached";
            case CANCELLED -> "cancelled";
            case SINGLE_PASS -> "single pass";
        };
    }
}
