package dev.nitid.psf;

import dev.nitid.image.Image;
import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.FontMetrics;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.geom.AffineTransform;
import java.awt.image.BufferedImage;
import java.util.List;
import java.util.Locale;

/**
 * Draws a PSF as a picture people can judge at a glance: the PSF on a logarithmic stretch, beside its
 * radial profile (every pixel as a dot, log scale, with the azimuthal mean) and its encircled-energy curve.
 *
 * <p>Layout: a title strip of {@value #TITLE} px with the model's name and figures; the PSF panel of
 * {@value #PANEL} × {@value #PANEL} px (each PSF pixel a square block) with a colour bar in decades of the
 * peak; two plots of {@value #PLOT_W} × {@value #PLOT_H} px stacked to the right. Row 0 of the image is
 * drawn at the bottom, as FITS viewers do. Works headless (java.awt only, no window).
 */
public final class PsfPreview {
    static final int TITLE = 44;
    static final int PANEL = 400;
    static final int PLOT_W = 420;
    static final int PLOT_H = 220;
    static final int GAP = 16;
    /** Decades of the peak shown by the log stretch (1 down to 10⁻⁵). */
    public static final int DECADES = 5;

    private static final Color BACKGROUND = new Color(250, 250, 248);
    private static final Color INK = new Color(30, 30, 30);
    private static final Color GRID = new Color(215, 215, 210);
    private static final Color DOTS = new Color(40, 90, 170, 90);
    private static final Color LINE = new Color(200, 60, 30);

    private PsfPreview() {
    }

    /**
     * Draws the preview.
     *
     * @param psf     the PSF, plane 0 (input, not modified)
     * @param figures its figures ({@link PsfFigures#of})
     * @param title   first title line, e.g. the model and its parameters
     * @return a new RGB picture
     */
    public static BufferedImage draw(Image psf, PsfFigures figures, String title) {
        int width = GAP + PANEL + 60 + GAP + PLOT_W + GAP;
        int height = TITLE + Math.max(PANEL + 40, 2 * PLOT_H + 3 * GAP + 40) + GAP;
        BufferedImage out = new BufferedImage(width, height, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = out.createGraphics();
        try {
            g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
            g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
            g.setColor(BACKGROUND);
            g.fillRect(0, 0, width, height);
            g.setColor(INK);
            drawFitted(g, title, width - 2 * GAP, GAP, 18);
            g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
            g.drawString(summary(figures), GAP, 36);
            drawPsf(g, psf, GAP, TITLE + 10);
            int px = GAP + PANEL + 60 + GAP;
            drawProfile(g, psf, figures, px, TITLE + 10);
            drawEnergy(g, figures, px, TITLE + 10 + PLOT_H + 3 * GAP + 10);
        } finally {
            g.dispose();
        }
        return out;
    }

    /**
     * The figures on one line, as the preview's second title line shows them.
     *
     * @param f the figures
     * @return e.g. {@code FWHM 2.285 px = 0.566"   r50 1.68 px   peak 0.1155   Strehl 0.923}
     */
    public static String summaryLine(PsfFigures f) {
        return summary(f);
    }

    /** Draws a bold title, shrinking the font (down to 10 pt) and then cutting it so it fits the width. */
    private static void drawFitted(Graphics2D g, String text, int maxWidth, int x, int y) {
        String t = text;
        for (int size = 14; size >= 10; size--) {
            g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, size));
            if (g.getFontMetrics().stringWidth(t) <= maxWidth) {
                g.drawString(t, x, y);
                return;
            }
        }
        FontMetrics fm = g.getFontMetrics();
        while (t.length() > 1 && fm.stringWidth(t + "...") > maxWidth) {
            t = t.substring(0, t.length() - 1);
        }
        g.drawString(t + "...", x, y);
    }

    static String summary(PsfFigures f) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "FWHM %.3f px", f.fwhmPx()));
        f.fwhmArcsec().ifPresent(a -> sb.append(String.format(Locale.ROOT, " = %.3f\"", a)));
        if (Math.abs(f.fwhmMajorPx() - f.fwhmMinorPx()) > 1e-3 * f.fwhmMajorPx()) {
            sb.append(String.format(Locale.ROOT, " (%.3f x %.3f px at %.1f deg)", f.fwhmMajorPx(), f.fwhmMinorPx(),
                    f.angleDeg()));
        }
        sb.append(String.format(Locale.ROOT, "   r50 %.2f px   peak %.4f", f.r50Px(), f.peak()));
        f.strehl().ifPresent(s -> sb.append(String.format(Locale.ROOT, "   Strehl %.3f", s)));
        f.plateScaleArcsec().ifPresent(s -> sb.append(String.format(Locale.ROOT, "   %.4f\"/px", s)));
        if (f.undersampled()) {
            sb.append("   under-sampled");
        }
        return sb.toString();
    }

    /** Maps log10(v/peak) in [−DECADES, 0] to a dark-blue → orange → white ramp. */
    static int colour(double t) {
        t = Math.max(0, Math.min(1, t));
        double[][] stops = {{0, 8, 8, 24}, {0.35, 60, 30, 110}, {0.6, 190, 60, 60}, {0.85, 250, 170, 40},
            {1, 255, 255, 235}};
        for (int i = 1; i < stops.length; i++) {
            if (t <= stops[i][0]) {
                double u = (t - stops[i - 1][0]) / (stops[i][0] - stops[i - 1][0]);
                int r = (int) Math.round(stops[i - 1][1] + u * (stops[i][1] - stops[i - 1][1]));
                int gg = (int) Math.round(stops[i - 1][2] + u * (stops[i][2] - stops[i - 1][2]));
                int b = (int) Math.round(stops[i - 1][3] + u * (stops[i][3] - stops[i - 1][3]));
                return (r << 16) | (gg << 8) | b;
            }
        }
        return 0xFFFFEB;
    }

    private static void drawPsf(Graphics2D g, Image psf, int x0, int y0) {
        int w = psf.width();
        int h = psf.height();
        float[] a = psf.plane(0);
        double peak = 0;
        for (float v : a) {
            peak = Math.max(peak, v);
        }
        int block = Math.max(1, PANEL / Math.max(w, h));
        int dw = block * w;
        int dh = block * h;
        int ox = x0 + (PANEL - dw) / 2;
        int oy = y0 + (PANEL - dh) / 2;
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                double v = a[y * w + x];
                double t = v > 0 ? 1 + Math.log10(v / peak) / DECADES : 0;
                g.setColor(new Color(colour(t)));
                // row 0 at the bottom
                g.fillRect(ox + x * block, oy + (h - 1 - y) * block, block, block);
            }
        }
        g.setColor(INK);
        g.drawRect(ox - 1, oy - 1, dw + 1, dh + 1);
        g.drawString(String.format(Locale.ROOT, "%d x %d px, log stretch", w, h), ox, oy + dh + 16);
        // colour bar
        int bx = x0 + PANEL + 12;
        for (int i = 0; i < PANEL; i++) {
            g.setColor(new Color(colour(1 - i / (double) (PANEL - 1))));
            g.fillRect(bx, y0 + i, 14, 1);
        }
        g.setColor(INK);
        g.drawRect(bx, y0, 14, PANEL);
        for (int d = 0; d <= DECADES; d++) {
            int yy = y0 + (int) Math.round(d * (PANEL - 1) / (double) DECADES);
            g.drawLine(bx + 14, yy, bx + 18, yy);
            g.drawString(d == 0 ? "peak" : "1e-" + d, bx + 20, yy + 4);
        }
    }

    private static void drawProfile(Graphics2D g, Image psf, PsfFigures f, int x0, int y0) {
        int w = psf.width();
        int h = psf.height();
        float[] a = psf.plane(0);
        double peak = f.peak();
        double rMax = Math.max(1, Math.min(w, h) / 2.0);
        axes(g, x0, y0, "radius [px]", "pixel / peak (log)", "Radial profile", rMax,
                new String[] {"1", "1e-1", "1e-2", "1e-3", "1e-4", "1e-5"});
        int pw = PLOT_W - 60;
        int ph = PLOT_H - 40;
        int px0 = x0 + 50;
        double[] mean = new double[(int) Math.ceil(rMax * 2) + 2];
        int[] count = new int[mean.length];
        g.setColor(DOTS);
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                double r = Math.hypot(x - f.centroidX(), y - f.centroidY());
                if (r > rMax) {
                    continue;
                }
                double v = a[y * w + x] / peak;
                int bin = (int) Math.round(r * 2);
                mean[bin] += a[y * w + x];
                count[bin]++;
                if (v <= 0) {
                    continue;
                }
                double t = -Math.log10(v) / DECADES;
                if (t > 1) {
                    continue;
                }
                int sx = px0 + (int) Math.round(r / rMax * pw);
                int sy = y0 + (int) Math.round(t * ph);
                g.fillOval(sx - 2, sy - 2, 4, 4);
            }
        }
        g.setColor(LINE);
        g.setStroke(new BasicStroke(1.6f));
        int lastX = -1;
        int lastY = -1;
        for (int b = 0; b < mean.length; b++) {
            if (count[b] == 0 || mean[b] <= 0) {
                lastX = -1;
                continue;
            }
            double t = -Math.log10(mean[b] / count[b] / peak) / DECADES;
            if (t > 1) {
                lastX = -1;
                continue;
            }
            int sx = px0 + (int) Math.round(b / 2.0 / rMax * pw);
            int sy = y0 + (int) Math.round(t * ph);
            if (lastX >= 0) {
                g.drawLine(lastX, lastY, sx, sy);
            }
            lastX = sx;
            lastY = sy;
        }
        g.setStroke(new BasicStroke(1f));
        legend(g, px0 + pw - 150, y0 + 14, List.of("pixels", "mean in 0.5 px rings"), List.of(DOTS, LINE));
    }

    private static void drawEnergy(Graphics2D g, PsfFigures f, int x0, int y0) {
        double[] r = f.eeRadiusPx();
        double[] e = f.encircledEnergy();
        double rMax = r.length == 0 ? 1 : r[r.length - 1];
        axes(g, x0, y0, "radius [px]", "encircled energy", "Encircled energy", rMax,
                new String[] {"1", "0.8", "0.6", "0.4", "0.2", "0"});
        int pw = PLOT_W - 60;
        int ph = PLOT_H - 40;
        int px0 = x0 + 50;
        g.setColor(LINE);
        g.setStroke(new BasicStroke(1.8f));
        int lx = px0;
        int ly = y0 + ph;
        for (int i = 0; i < r.length; i++) {
            int sx = px0 + (int) Math.round(r[i] / rMax * pw);
            int sy = y0 + (int) Math.round((1 - e[i]) * ph);
            g.drawLine(lx, ly, sx, sy);
            lx = sx;
            ly = sy;
        }
        g.setStroke(new BasicStroke(1f));
        g.setColor(INK);
        for (double[] mark : new double[][] {{f.r50Px(), 0.5}, {f.r80Px(), 0.8}}) {
            if (!Double.isFinite(mark[0])) {
                continue;
            }
            int sx = px0 + (int) Math.round(mark[0] / rMax * pw);
            int sy = y0 + (int) Math.round((1 - mark[1]) * ph);
            g.drawLine(sx, sy, sx, y0 + ph);
            g.drawString(String.format(Locale.ROOT, "%d%% at %.2f px", (int) Math.round(mark[1] * 100), mark[0]),
                    sx + 4, sy - 4);
        }
    }

    /** Frame, grid, tick labels and titles of one plot; y ticks run top to bottom. */
    private static void axes(Graphics2D g, int x0, int y0, String xLabel, String yLabel, String title, double xMax,
                             String[] yTicks) {
        int pw = PLOT_W - 60;
        int ph = PLOT_H - 40;
        int px0 = x0 + 50;
        g.setColor(Color.WHITE);
        g.fillRect(px0, y0, pw, ph);
        g.setColor(GRID);
        for (int i = 0; i < yTicks.length; i++) {
            int yy = y0 + (int) Math.round(i * ph / (double) (yTicks.length - 1));
            g.drawLine(px0, yy, px0 + pw, yy);
        }
        double step = niceStep(xMax / 6);
        for (double x = 0; x <= xMax + 1e-9; x += step) {
            int xx = px0 + (int) Math.round(x / xMax * pw);
            g.drawLine(xx, y0, xx, y0 + ph);
        }
        g.setColor(INK);
        g.drawRect(px0, y0, pw, ph);
        FontMetrics fm = g.getFontMetrics();
        for (int i = 0; i < yTicks.length; i++) {
            int yy = y0 + (int) Math.round(i * ph / (double) (yTicks.length - 1));
            g.drawString(yTicks[i], px0 - 6 - fm.stringWidth(yTicks[i]), yy + 4);
        }
        for (double x = 0; x <= xMax + 1e-9; x += step) {
            int xx = px0 + (int) Math.round(x / xMax * pw);
            String s = step >= 1 ? String.format(Locale.ROOT, "%.0f", x) : String.format(Locale.ROOT, "%.1f", x);
            g.drawString(s, xx - fm.stringWidth(s) / 2, y0 + ph + 14);
        }
        g.drawString(xLabel, px0 + pw / 2 - fm.stringWidth(xLabel) / 2, y0 + ph + 30);
        Font bold = g.getFont().deriveFont(Font.BOLD);
        Font plain = g.getFont();
        g.setFont(bold);
        g.drawString(title, px0, y0 - 4);
        g.setFont(plain);
        AffineTransform saved = g.getTransform();
        g.rotate(-Math.PI / 2, x0 + 10, y0 + ph / 2.0);
        g.drawString(yLabel, x0 + 10 - fm.stringWidth(yLabel) / 2, y0 + ph / 2 + 4);
        g.setTransform(saved);
    }

    private static void legend(Graphics2D g, int x, int y, List<String> labels, List<Color> colours) {
        for (int i = 0; i < labels.size(); i++) {
            g.setColor(colours.get(i));
            g.fillRect(x, y + i * 16 - 8, 12, 8);
            g.setColor(INK);
            g.drawString(labels.get(i), x + 18, y + i * 16);
        }
    }

    private static double niceStep(double raw) {
        double p = Math.pow(10, Math.floor(Math.log10(raw)));
        double m = raw / p;
        double nice = m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10;
        return nice * p;
    }
}
