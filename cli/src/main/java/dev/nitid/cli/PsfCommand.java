package dev.nitid.cli;

import dev.nitid.fits.FitsException;
import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.WriteOptions;
import dev.nitid.image.Image;
import dev.nitid.psf.PsfFigures;
import dev.nitid.psf.PsfModel;
import dev.nitid.psf.PsfHeader;
import dev.nitid.psf.PsfPreview;
import java.awt.image.BufferedImage;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import javax.imageio.ImageIO;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code nitid psf --model gaussian|moffat|airy … -o PSF.fits [--preview PSF.png]}: builds a PSF from a
 * model, writes it as a float32 FITS image with every parameter and derived figure in the header, and
 * optionally a preview picture.
 */
@Command(name = "psf", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Builds a PSF from a model and writes it as FITS: a Gaussian or Moffat of",
            "given FWHM, or the diffraction pattern of a telescope (aperture, central",
            "obstruction, spider vanes, Zernike aberrations, one wavelength or a band),",
            "optionally blurred by seeing and tracking jitter. The PSF is odd-sized,",
            "centred on its middle pixel, pixel-integrated and sums to 1.",
            "",
            "Examples:",
            "  nitid psf --model moffat --fwhm 3.2 --beta 3 -o moffat.fits",
            "  nitid psf --model airy --aperture 200 --obstruction 0.33 --vanes 4 \\",
            "      --vane-width 2 --focal-length 1000 --pixel-size 3.76 --band 500-600 \\",
            "      --seeing 2 -o scope.fits --preview scope.png",
            ""})
public final class PsfCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    CommonOptions common;

    @Mixin
    PsfOptions psf;

    @Option(names = {"--size", "--psf-size"}, paramLabel = "PX",
            description = "PSF image side in pixels, odd (default: chosen from the model to hold its wings).")
    Integer size;

    @Option(names = {"-o", "--output"}, paramLabel = "PSF.fits", required = true,
            description = "FITS file to write (float32).")
    Path output;

    @Option(names = "--preview", paramLabel = "PSF.png",
            description = "Also draw the PSF on a log stretch beside its radial profile and encircled energy (PNG).")
    Path preview;

    @Option(names = "--overwrite", description = "Replace existing output files.")
    boolean overwrite;

    @Override
    public Integer call() {
        return Failures.run(spec, common, () -> {
            PsfModel model = psf.toModel();
            int side = side();
            int os = psf.oversample();
            if (preview != null && !overwrite && Files.exists(preview)) {
                throw new FitsException(FitsException.Kind.OUTPUT_EXISTS, preview, -1, null,
                        "the preview file exists (add --overwrite to replace it, or choose another name)");
            }
            long t0 = System.nanoTime();
            Image image = model.render(side, os, 0, 0);
            PsfFigures figures = PsfFigures.of(image, model);
            double seconds = (System.nanoTime() - t0) / 1e9;
            FitsHeader header = PsfHeader.of(model, figures, side, os, "nitid " + NitidCommand.toolVersion() + " psf")
                    .withHistory("command: nitid " + String.join(" ", spec.commandLine().getParseResult().originalArgs()));
            FitsWriter.write(output, image, header, WriteOptions.defaults().withOverwrite(overwrite));
            if (preview != null) {
                writePreview(model, image, figures);
            }
            PrintWriter err = spec.commandLine().getErr();
            java.util.List<String> warnings = new java.util.ArrayList<>(figures.warnings());
            subPixelNote(model, os).ifPresent(warnings::add);
            for (String w : warnings) {
                if (!common.quiet()) {
                    err.println("nitid: warning: " + w);
                }
            }
            err.flush();
            if (!common.quiet()) {
                PrintWriter out = spec.commandLine().getOut();
                out.printf(Locale.ROOT, "wrote %s: %s PSF, %d x %d px, oversample %d, %.2f s%n", output,
                        model.family(), side, side, os, seconds);
                out.println("  " + PsfPreview.summaryLine(figures));
                if (preview != null) {
                    out.println("wrote " + preview);
                }
                out.flush();
            }
            return ExitCode.OK;
        });
    }

    /** Sub-pixels coarser than this (in λ/D) make the midpoint-rule pixel integration visibly inexact. */
    static final double FINE_SUBPIXEL_LD = 0.1;

    /**
     * For diffraction models, warns when the sub-pixels are coarse in λ/D: the midpoint rule then reads the
     * central pixel high by about h²π²/24 of itself (h = sub-pixel in λ/D; error term of the midpoint rule,
     * Davis &amp; Rabinowitz, with ∇²I/I ≈ −π² at the Airy core).
     */
    static java.util.Optional<String> subPixelNote(PsfModel model, int os) {
        if (model.pixelOverNyquist().isEmpty()) {
            return java.util.Optional.empty();
        }
        double pixelLd = model.pixelOverNyquist().getAsDouble() / 2;
        double h = pixelLd / os;
        if (h <= FINE_SUBPIXEL_LD) {
            return java.util.Optional.empty();
        }
        int better = (int) Math.ceil(pixelLd / FINE_SUBPIXEL_LD);
        return java.util.Optional.of(String.format(Locale.ROOT, "sub-pixels are %.2f lambda/D wide, so the central pixel"
                + " may read about %.1f%% high (use --oversample %d or more for 0.1 lambda/D)",
                h, 100 * h * h * Math.PI * Math.PI / 24, better));
    }

    private int side() {
        return psf.side(size, "--size");
    }

    private void writePreview(PsfModel model, Image image, PsfFigures figures) throws FitsException {
        BufferedImage pic = PsfPreview.draw(image, figures, title(model));
        try {
            Path parent = preview.toAbsolutePath().getParent();
            if (parent != null && !Files.isDirectory(parent)) {
                throw new FitsException(FitsException.Kind.CANNOT_CREATE, preview, -1, null,
                        "the folder does not exist (create it or choose another path)");
            }
            if (!ImageIO.write(pic, "png", preview.toFile())) {
                throw new IOException("no PNG writer in this Java runtime");
            }
        } catch (IOException e) {
            throw new FitsException(FitsException.Kind.WRITE_FAILED, preview, -1, null,
                    "cannot write the preview: " + e.getMessage() + " (check the path and free space)", e);
        }
    }

    static String title(PsfModel model) {
        return model.description();
    }
}
