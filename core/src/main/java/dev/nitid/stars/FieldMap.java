package dev.nitid.stars;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.image.BufferedImage;
import java.util.Locale;

/**
 * Draws the field map of a {@link StarMeasurement}: the frame with its grid of regions coloured by median
 * FWHM (blue = sharpest region, orange = softest) and labelled with FWHM, ellipticity and star count, and
 * one whisker per accepted star along its major axis with a length proportional to its ellipticity (the
 * usual way to show an optical field's aberration and tilt pattern; common practice, no source).
 *
 * <p>Image row 0 (FITS row 1) is drawn at the bottom, as FITS viewers do. Works headless (only a
 * {@link BufferedImage} is drawn); text needs a font, as any Java2D text does.
 */
public final class FieldMap {
    /** Longest side of the frame panel, pixels (small frames are enlarged, large ones reduced). */
    public static final int PANEL_MAX = 640;
    /** Whisker length in panel pixels for an ellipticity of 0.1. */
    public static final int WHISKER_PER_TENTH = 18;
    private static final int MARGIN = 12;
    private static final int TITLE = 26;
    private static final int LEGEND = 56;

    private FieldMap() {
    }

    /**
     * @param m     the measurement (input, not modified)
     * @param scale the plate scale, or {@code null} when unknown (FWHM then in pixels only)
     * @param title text for the title strip (file name, usually)
     * @return the picture
     */
    public static BufferedImage draw(StarMeasurement m, PlateScale scale, String title) {
        double k = (double) PANEL_MAX / Math.max(m.width(), m.height());
        int pw = Math.max(1, (int) Math.round(m.width() * k));
        int ph = Math.max(1, (int) Math.round(m.height() * k));
        int width = Math.max(pw + 2 * MARGIN, 560);
        int height = TITLE + ph + LEGEND + MARGIN;
        BufferedImage out = new BufferedImage(width, height, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = out.createGraphics();
        try {
            g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
            g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
            g.setColor(new Color(28, 28, 32));
            g.fillRect(0, 0, width, height);
            g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 13));
            g.setColor(Color.WHITE);
            g.drawString(title, MARGIN, 18);
            int ox = MARGIN;
            int oy = TITLE;
            double lo = Double.POSITIVE_INFINITY;
            double hi = Double.NEGATIVE_INFINITY;
            for (RegionSummary r : m.regions()) {
                if (r.count() > 0) {
                    lo = Math.min(lo, r.fwhm());
                    hi = Math.max(hi, r.fwhm());
                }
            }
            g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 11));
            for (RegionSummary r : m.regions()) {
                int x0 = ox + (int) Math.round(r.x0() * k);
                int x1 = ox + (int) Math.round(r.x1() * k);
                // Row 0 at the bottom: image y grows upwards on the page.
                int y0 = oy + ph - (int) Math.round(r.y1() * k);
                int y1 = oy + ph - (int) Math.round(r.y0() * k);
                Color c = r.count() == 0 ? new Color(60, 60, 60) : colour(hi > lo ? (r.fwhm() - lo) / (hi - lo) : 0.5);
                g.setColor(c);
                g.fillRect(x0, y0, x1 - x0, y1 - y0);
                g.setColor(new Color(200, 200, 200));
                g.drawRect(x0, y0, x1 - x0, y1 - y0);
                g.setColor(Color.WHITE);
                int ty = y0 + 14;
                if (r.count() == 0) {
                    g.drawString("no stars", x0 + 4, ty);
                    continue;
                }
                String fw = String.format(Locale.ROOT, "%.2f px", r.fwhm());
                if (scale != null) {
                    fw += String.format(Locale.ROOT, " %.2f\"", scale.toArcsec(r.fwhm()));
                }
                g.drawString(fw, x0 + 4, ty);
                g.drawString(String.format(Locale.ROOT, "e %.3f  n %d", r.ellipticity(), r.count()), x0 + 4, ty + 13);
            }
            g.setStroke(new BasicStroke(1.5f));
            for (MeasuredStar s : m.stars()) {
                StarProfile p = s.profile(m.bestShape()) != null ? s.profile(m.bestShape()) : s.gaussian();
                double cx = ox + s.x() * k;
                double cy = oy + ph - s.y() * k;
                double len = WHISKER_PER_TENTH * p.ellipticity() / 0.1;
                // Page y points down while image y points up: flip the angle's y component.
                double dx = 0.5 * len * Math.cos(p.angle());
                double dy = -0.5 * len * Math.sin(p.angle());
                g.setColor(Color.WHITE);
                g.drawLine((int) Math.round(cx - dx), (int) Math.round(cy - dy), (int) Math.round(cx + dx),
                        (int) Math.round(cy + dy));
                g.fillOval((int) Math.round(cx) - 1, (int) Math.round(cy) - 1, 3, 3);
            }
            g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
            g.setColor(Color.WHITE);
            int ly = oy + ph + 16;
            ProfileSummary b = m.best();
            g.drawString(String.format(Locale.ROOT, "%d stars, %s fit: FWHM %.2f px%s, ellipticity %.3f",
                    m.stars().size(), m.bestShape().name().toLowerCase(Locale.ROOT), b.fwhm(),
                    scale == null ? " (arcsec unknown)" : String.format(Locale.ROOT, " = %.2f\"", scale.toArcsec(b.fwhm())),
                    b.ellipticity()), MARGIN, ly);
            g.drawString(String.format(Locale.ROOT, "whisker: major axis, %d px per 0.1 ellipticity", WHISKER_PER_TENTH),
                    MARGIN, ly + 16);
            g.drawString(String.format(Locale.ROOT, "colour: region FWHM, blue %.2f px to orange %.2f px", lo, hi),
                    MARGIN, ly + 32);
        } finally {
            g.dispose();
        }
        return out;
    }

    /** Blue (t = 0) to orange (t = 1). */
    private static Color colour(double t) {
        t = Math.max(0, Math.min(1, t));
        int r = (int) Math.round(40 + t * (220 - 40));
        int gr = (int) Math.round(90 + t * (120 - 90));
        int b = (int) Math.round(170 + t * (40 - 170));
        return new Color(r, gr, b);
    }
}
