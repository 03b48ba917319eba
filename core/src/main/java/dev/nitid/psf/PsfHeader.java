package dev.nitid.psf;

import dev.nitid.fits.FitsHeader;

/**
 * The FITS cards that describe a rendered PSF model: every {@linkplain PsfModel#parameters() model parameter},
 * the rendering settings (PSFSIZE, SUBPIXEL, PSFSUM), the figures measured on the rendered image (FWHM,
 * FWHMMAJ, FWHMMIN, FWHMANG, R50, R80, FWHMAS when finite or known) and the optical figures the model knows
 * (PLTSCALE, STREHL, NYQRATIO, UNDERSMP), then two HISTORY cards. The keywords are listed in
 * {@code docs/psf.md}; the card value types follow the FITS Standard 4.0 §4.2 (real, integer, logical,
 * string).
 */
public final class PsfHeader {
    private PsfHeader() {
    }

    /**
     * Appends a model's parameter cards ({@link PsfModel#parameters()}) to a header: the model's shape,
     * widths, optics and band, each under its own keyword with its comment.
     *
     * @param h     the header to extend (input, not modified)
     * @param model the PSF model
     * @return a new header: {@code h} followed by the model's cards
     */
    public static FitsHeader withModel(FitsHeader h, PsfModel model) {
        FitsHeader out = h;
        for (PsfParameter p : model.parameters()) {
            Object v = p.value();
            if (v instanceof Double d) {
                out = out.with(p.key(), d, p.comment());
            } else if (v instanceof Long l) {
                out = out.with(p.key(), l, p.comment());
            } else if (v instanceof Boolean b) {
                out = out.with(p.key(), b, p.comment());
            } else {
                out = out.with(p.key(), String.valueOf(v), p.comment());
            }
        }
        return out;
    }

    /**
     * Describes a rendered PSF.
     *
     * @param model      the model rendered (input, not modified)
     * @param figures    the figures measured on the rendered image, e.g. {@link PsfFigures#of(dev.nitid.image.Image,
     *                   PsfModel)} (input, not modified)
     * @param size       side of the rendered image, pixels
     * @param oversample sub-pixels per pixel per axis used for the render
     * @param producer   what made it, for the first HISTORY card (e.g. {@code "nitid 0.1.0 psf"}); ASCII
     * @return a new header holding only these cards
     * @throws IllegalArgumentException if {@code producer} is null or not printable ASCII
     */
    public static FitsHeader of(PsfModel model, PsfFigures figures, int size, int oversample, String producer) {
        if (producer == null) {
            throw new IllegalArgumentException("producer is null: name what rendered the PSF, e.g. \"nitid psf\"");
        }
        FitsHeader h = withModel(FitsHeader.empty(), model);
        h = h.with("PSFSIZE", (long) size, "[px] PSF image side (odd; centre pixel is the PSF centre)")
                .with("SUBPIXEL", (long) oversample, "sub-pixels per pixel per axis (1 = point sampled)")
                .with("PSFSUM", 1.0, "the image is normalised to sum 1");
        PsfFigures f = figures;
        if (Double.isFinite(f.fwhmPx())) {
            h = h.with("FWHM", f.fwhmPx(), "[px] FWHM measured on this image")
                    .with("FWHMMAJ", f.fwhmMajorPx(), "[px] measured major-axis FWHM")
                    .with("FWHMMIN", f.fwhmMinorPx(), "[px] measured minor-axis FWHM")
                    .with("FWHMANG", f.angleDeg(), "[deg] measured major-axis angle from +x to +y");
        }
        if (Double.isFinite(f.r50Px())) {
            h = h.with("R50", f.r50Px(), "[px] radius holding 50% of the flux");
        }
        if (Double.isFinite(f.r80Px())) {
            h = h.with("R80", f.r80Px(), "[px] radius holding 80% of the flux");
        }
        if (f.fwhmArcsec().isPresent() && Double.isFinite(f.fwhmPx())) {
            h = h.with("FWHMAS", f.fwhmArcsec().getAsDouble(), "[arcsec] measured FWHM");
        }
        if (f.plateScaleArcsec().isPresent()) {
            h = h.with("PLTSCALE", f.plateScaleArcsec().getAsDouble(), "[arcsec/px] 206.264806*PIXSIZE/FOCALLEN");
        }
        if (f.strehl().isPresent()) {
            h = h.with("STREHL", f.strehl().getAsDouble(), "optical Strehl ratio (aberrations, no seeing)");
        }
        if (f.pixelOverNyquist().isPresent()) {
            h = h.with("NYQRATIO", f.pixelOverNyquist().getAsDouble(), "pixel / Nyquist pixel lambda_min/(2D)")
                    .with("UNDERSMP", f.undersampled(), "T if the pixel exceeds the Nyquist pixel");
        }
        return h.withHistory(producer + ": " + model.description())
                .withHistory("PSF rendered on " + size + "x" + size + " px, " + oversample + "x" + oversample
                        + " sub-pixels per pixel, normalised to sum 1");
    }
}
