package dev.nitid.stars;

import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.Wcs;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * Arcseconds per pixel, and where the number came from.
 *
 * <p>Small-angle plate scale: {@code 206.264806 × pixel[µm] / focal length[mm]} arcsec per pixel
 * (206 264.806 = 648000/π arcsec per radian; textbook optics, common practice).
 *
 * @param arcsecPerPixel the scale, &gt; 0
 * @param source         a short phrase for reports, e.g. "WCS (CD matrix)"
 */
public record PlateScale(double arcsecPerPixel, String source) {
    /** Arcseconds per radian divided by 1000 (µm/mm): scale = this × pixel[µm] / focal[mm]. */
    public static final double ARCSEC_PER_RADIAN_MILLI = 648000 / Math.PI / 1000;

    /** The numeric keywords {@link #fromHeader} reads. */
    private static final java.util.List<String> KEYWORDS = java.util.List.of("CD1_1", "CD1_2", "CD2_1", "CD2_2",
            "CDELT1", "CDELT2", "PC1_1", "PC1_2", "PC2_1", "PC2_2", "FOCALLEN", "XPIXSZ", "YPIXSZ", "PIXSIZE1",
            "PIXSIZE2", "XBINNING", "YBINNING");

    /** Validates the scale. */
    public PlateScale {
        if (!(arcsecPerPixel > 0) || !Double.isFinite(arcsecPerPixel)) {
            throw new IllegalArgumentException("plate scale " + arcsecPerPixel
                    + " arcsec/pixel must be a finite number > 0");
        }
        if (source == null || source.isBlank()) {
            throw new IllegalArgumentException("plate scale source is empty: say where the scale came from");
        }
    }

    /**
     * From optics: {@code 206.264806·p·binning/f}.
     *
     * @param pixelMicrons  unbinned pixel pitch, µm, &gt; 0
     * @param focalMm       focal length, mm, &gt; 0
     * @param binning       pixel binning, ≥ 1
     * @param source        where the numbers came from
     * @return the scale
     */
    public static PlateScale fromOptics(double pixelMicrons, double focalMm, int binning, String source) {
        if (!(pixelMicrons > 0) || !(focalMm > 0) || binning < 1) {
            throw new IllegalArgumentException("pixel size " + pixelMicrons + " µm, focal length " + focalMm
                    + " mm and binning " + binning + " must all be positive");
        }
        return new PlateScale(ARCSEC_PER_RADIAN_MILLI * pixelMicrons * binning / focalMm, source);
    }

    /**
     * Reads the scale from a header, in this order:
     * <ol>
     *   <li>the WCS ({@code CDi_j}, or {@code CDELTi} with {@code PCi_j}): {@link Wcs#pixelScaleArcsec};</li>
     *   <li>{@code FOCALLEN} (mm) with {@code XPIXSZ}/{@code YPIXSZ} (µm), keywords common in amateur
     *       capture files; these pixel sizes already include binning in the convention we know (from
     *       memory), so binning is not applied again;</li>
     *   <li>{@code FOCALLEN} with {@code PIXSIZE1}/{@code PIXSIZE2} (µm, unbinned) times
     *       {@code XBINNING}/{@code YBINNING} (default 1).</li>
     * </ol>
     * Two axes are combined by their geometric mean.
     *
     * @param h the header (input, not modified)
     * @return the scale, or empty when the header does not say
     * @throws IllegalArgumentException if one of the keywords above holds something that is not a FITS
     *                                  number (FITS Standard 4.0 §4.2.3–4.2.4), e.g. {@code FOCALLEN = 'abc'}:
     *                                  the header means to give a scale, and silently skipping the card
     *                                  would report another one or none
     */
    public static Optional<PlateScale> fromHeader(FitsHeader h) {
        for (String key : KEYWORDS) {
            Optional<String> bad = h.malformedNumber(key);
            if (bad.isPresent()) {
                throw new IllegalArgumentException(key + " is " + bad.get() + ", not a number (FITS Standard 4.0 "
                        + "§4.2.3-4.2.4), so the plate scale cannot be read from the header: correct or remove "
                        + "the card, or give the plate scale explicitly");
            }
        }
        OptionalDouble wcs = Wcs.pixelScaleArcsec(h);
        if (wcs.isPresent()) {
            String how = h.getDouble("CD1_1").isPresent() || h.getDouble("CD2_2").isPresent() ? "CD matrix" : "CDELT";
            return Optional.of(new PlateScale(wcs.getAsDouble(), "WCS (" + how + ")"));
        }
        OptionalDouble f = h.getDouble("FOCALLEN");
        if (f.isEmpty() || !(f.getAsDouble() > 0)) {
            return Optional.empty();
        }
        double focal = f.getAsDouble();
        OptionalDouble px = mean(h.getDouble("XPIXSZ"), h.getDouble("YPIXSZ"));
        if (px.isPresent()) {
            return Optional.of(new PlateScale(ARCSEC_PER_RADIAN_MILLI * px.getAsDouble() / focal,
                    "FOCALLEN and XPIXSZ/YPIXSZ"));
        }
        OptionalDouble raw = mean(h.getDouble("PIXSIZE1"), h.getDouble("PIXSIZE2"));
        if (raw.isPresent()) {
            double bx = h.getDouble("XBINNING").orElse(1);
            double by = h.getDouble("YBINNING").orElse(bx);
            double bin = Math.sqrt(Math.max(1, bx) * Math.max(1, by));
            return Optional.of(new PlateScale(ARCSEC_PER_RADIAN_MILLI * raw.getAsDouble() * bin / focal,
                    "FOCALLEN, PIXSIZE1/PIXSIZE2 and binning"));
        }
        return Optional.empty();
    }

    private static OptionalDouble mean(OptionalDouble a, OptionalDouble b) {
        boolean ha = a.isPresent() && a.getAsDouble() > 0;
        boolean hb = b.isPresent() && b.getAsDouble() > 0;
        if (ha && hb) {
            return OptionalDouble.of(Math.sqrt(a.getAsDouble() * b.getAsDouble()));
        }
        if (ha) {
            return a;
        }
        return hb ? b : OptionalDouble.empty();
    }

    /**
     * @param pixels a length in pixels
     * @return the same length in arcseconds
     */
    public double toArcsec(double pixels) {
        return pixels * arcsecPerPixel;
    }
}
