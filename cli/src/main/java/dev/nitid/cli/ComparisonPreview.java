package dev.nitid.cli;

import dev.nitid.image.AsinhStretch;
import dev.nitid.image.Image;
import java.awt.Color;
import java.awt.Font;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.image.BufferedImage;
import java.util.List;

/**
 * Draws the before/after picture a user judges a restoration by: the whole input and output side by
 * side on the same asinh stretch, then magnified crops of a few bright stars and of a faint region.
 *
 * <p>Layout (documented in the README): a title strip of {@value #TITLE_HEIGHT} px; two panels of at most
 * {@value #PANEL_MAX} px on the long side (block-averaged when the image is larger); below them one row
 * of at most {@value #MAX_CROPS} crop pairs (input left, restored right), each crop {@value #CROP} image
 * pixels magnified {@value #ZOOM}×; the picture is as wide as the wider of the two rows. Image row 0 (FITS row 1)
 * is drawn at the bottom, as FITS viewers do.
 */
final class ComparisonPreview {
    static final int TITLE_HEIGHT = 24;
    static final int PANEL_MAX = 720;
    static final int CROP = 33;
    static final int ZOOM = 4;
    static final int GAP = 8;
    static final int MAX_CROPS = 4;

    private ComparisonPreview() {
    }

    /**
     * @param before   the input (input, not modified)
     * @param after    the restored image, same shape (input, not modified)
     * @param stretch  one stretch for both, usually {@link AsinhStretch#forSky} of the input
     * @param crops    crop centres (x, y) in image pixels: bright stars first, a faint region last
     * @param title    text for the title strip
     * @return the picture
     */
    static BufferedImage draw(Image before, Image after, AsinhStretch stretch, List<int[]> crops, String title) {
        if (!before.sameShape(after)) {
            throw new IllegalArgumentException("input is " + before + " but output is " + after
                    + ": the preview needs two images of the same shape");
        }
        int block = Math.max(1, (int) Math.ceil(Math.max(before.width(), before.height()) / (double) PANEL_MAX));
        int pw = (before.width() + block - 1) / block;
        int ph = (before.height() + block - 1) / block;
        int cropSide = CROP * ZOOM;
        int nCrops = Math.min(crops.size(), MAX_CROPS);
        int width = Math.max(2 * pw + 3 * GAP, nCrops * (2 * cropSide + 3 * GAP) + GAP);
        int height = TITLE_HEIGHT + ph + 2 * GAP + (nCrops > 0 ? cropSide + TITLE_HEIGHT + GAP : 0);
        BufferedImage out = new BufferedImage(width, height, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = out.createGraphics();
        g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
        g.setColor(new Color(32, 32, 32));
        g.fillRect(0, 0, width, height);
        g.setColor(Color.WHITE);
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 13));
        g.drawString(title, GAP, 16);
        drawPanel(out, before, stretch, block, GAP, TITLE_HEIGHT);
        drawPanel(out, after, stretch, block, 2 * GAP + pw, TITLE_HEIGHT);
        g.drawString("input", GAP + 4, TITLE_HEIGHT + 14);
        g.drawString("restored", 2 * GAP + pw + 4, TITLE_HEIGHT + 14);
        int y0 = TITLE_HEIGHT + ph + 2 * GAP;
        for (int i = 0; i < nCrops; i++) {
            int[] c = crops.get(i);
            int x0 = GAP + i * (2 * cropSide + 3 * GAP);
            boolean faint = i == crops.size() - 1 && crops.size() > 1;
            g.drawString((faint ? "faint region" : "star") + " at (" + c[0] + ", " + c[1] + ")", x0, y0 + 14);
            drawCrop(out, before, stretch, c[0], c[1], x0, y0 + TITLE_HEIGHT);
            drawCrop(out, after, stretch, c[0], c[1], x0 + cropSide + GAP, y0 + TITLE_HEIGHT);
        }
        g.dispose();
        return out;
    }

    private static void drawPanel(BufferedImage out, Image img, AsinhStretch s, int block, int ox, int oy) {
        int pw = (img.width() + block - 1) / block;
        int ph = (img.height() + block - 1) / block;
        int planes = img.planes();
        float[] v = new float[planes];
        double[] d = new double[planes];
        for (int py = 0; py < ph; py++) {
            for (int px = 0; px < pw; px++) {
                for (int p = 0; p < planes; p++) {
                    v[p] = blockMean(img.plane(p), img.width(), img.height(), px * block, py * block, block);
                }
                s.apply(v, d);
                out.setRGB(ox + px, oy + ph - 1 - py, rgb(d));
            }
        }
    }

    private static void drawCrop(BufferedImage out, Image img, AsinhStretch s, int cx, int cy, int ox, int oy) {
        int planes = img.planes();
        float[] v = new float[planes];
        double[] d = new double[planes];
        int half = CROP / 2;
        for (int j = 0; j < CROP; j++) {
            for (int i = 0; i < CROP; i++) {
                int x = cx - half + i;
                int y = cy - half + j;
                boolean inside = x >= 0 && y >= 0 && x < img.width() && y < img.height();
                for (int p = 0; p < planes; p++) {
                    v[p] = inside ? img.plane(p)[y * img.width() + x] : Float.NaN;
                }
                s.apply(v, d);
                int rgb = inside ? rgb(d) : 0x202020;
                for (int zy = 0; zy < ZOOM; zy++) {
                    for (int zx = 0; zx < ZOOM; zx++) {
                        out.setRGB(ox + i * ZOOM + zx, oy + (CROP - 1 - j) * ZOOM + zy, rgb);
                    }
                }
            }
        }
    }

    private static float blockMean(float[] plane, int w, int h, int x0, int y0, int block) {
        double sum = 0;
        int n = 0;
        for (int y = y0; y < Math.min(h, y0 + block); y++) {
            for (int x = x0; x < Math.min(w, x0 + block); x++) {
                float f = plane[y * w + x];
                if (Float.isFinite(f)) {
                    sum += f;
                    n++;
                }
            }
        }
        return n == 0 ? Float.NaN : (float) (sum / n);
    }

    private static int rgb(double[] d) {
        if (d.length >= 3) {
            return (level(d[0]) << 16) | (level(d[1]) << 8) | level(d[2]);
        }
        int l = level(d[0]);
        return (l << 16) | (l << 8) | l;
    }

    private static int level(double v) {
        return Double.isNaN(v) ? 0 : (int) Math.round(255 * Math.min(1, Math.max(0, v)));
    }
}
