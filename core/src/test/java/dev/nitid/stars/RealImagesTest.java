package dev.nitid.stars;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import dev.nitid.image.Image;
import dev.nitid.testdata.Reference;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import nom.tam.fits.BasicHDU;
import nom.tam.fits.Fits;
import org.junit.jupiter.api.Test;

/**
 * Real images shipped inside Debian packages, read from the installed package (never copied into the
 * repository), against photutils 1.6.0 / astropy 5.2.1 results in reference/golden/real_stars_*.csv
 * (made by reference/gen_real_stars.py). Skipped where the package is not installed.
 */
class RealImagesTest {
    /** skimage 0.19.3 test image: M51, B band (python3-skimage). */
    static final Path M51 = Path.of("/usr/lib/python3/dist-packages/skimage/data/simple.fits");
    /** Digitized Sky Survey cutout (python3-astropy 5.2.1). */
    static final Path DSS = Path.of("/usr/lib/python3/dist-packages/astropy/wcs/tests/data/dss.14.29.56-62.41.05.fits.gz");
    /**
     * Share of photutils' 131 sources in the crowded DSS cutout that we must also detect within 1 px (with a
     * 2-px separation). Measured 108 of 131 = 82.4 % with the second look through the zero-sum kernel (99 = 76 %
     * before it); the floor is 105 of 131 (80.2 %): a margin of three sources (project margin, no source) for
     * changes of floating-point order. Lower than the 95 % met on the uncrowded golden field: of the 23 misses,
     * 14 have another photutils source within 4 px (pairs that no Gaussian matched filter of FWHM 3 px splits)
     * and 9 lie 4.2–10.9 px from their nearest photutils neighbour (one in the corner, found 1.04 px off).
     */
    private static final double DSS_MATCHED = 0.80;
    /** Positions of isolated unsaturated stars, px (reference README §8 suggested tolerance). */
    private static final double POSITION_PX = 0.3;
    /** Same method as the reference (point-sampled Gaussian + constant, 11×11 box): only solver noise differs. */
    private static final double SAME_METHOD_FWHM_REL = 0.01;
    /** Pipeline FWHM (pixel-integrated model, other stamp) vs the reference's point-sampled fit (README §8: 10 %). */
    private static final double PIPELINE_FWHM_REL = 0.10;
    /** Centroid against astropy's Gaussian2D on the same cutout (same model, same pixels): 0.05 px (project margin). */
    private static final double SAME_METHOD_POSITION_PX = 0.05;
    /** An accepted star this close to the galaxy nucleus would be the nucleus, px (project choice: ~1.3 FWHM). */
    private static final double NUCLEUS_PX = 3;
    /**
     * Extra FWHM allowance for the fainter reference stars 3..7, px: their photutils FWHM itself scatters by about
     * a tenth of a pixel at their S/N (project margin, no source).
     */
    private static final double FAINT_REFERENCE_FWHM_PX = 0.1;
    /** At least this many of the five reference stars 3..7 must be accepted (project choice). */
    private static final int MIN_REFERENCE_STARS = 3;
    /** Issue 6 wording: the ten brightest photutils sources; allow one saturated plate star to split (project choice). */
    private static final int MIN_BRIGHTEST_MATCHED = 9;
    /** Detections match photutils sources within this distance, px (the DAO acceptance figure of issue 6). */
    private static final double DETECTION_MATCH_PX = 1.0;

    /** Reads the primary image with nom-tam-fits (test scope), applying BSCALE/BZERO. */
    static Image read(Path p) throws Exception {
        try (Fits f = new Fits(p.toFile())) {
            BasicHDU<?> hdu = f.readHDU();
            int w = hdu.getHeader().getIntValue("NAXIS1");
            int h = hdu.getHeader().getIntValue("NAXIS2");
            double bz = hdu.getHeader().getDoubleValue("BZERO", 0);
            double bs = hdu.getHeader().getDoubleValue("BSCALE", 1);
            Object k = hdu.getKernel();
            float[] px = new float[w * h];
            for (int y = 0; y < h; y++) {
                Object row = java.lang.reflect.Array.get(k, y);
                for (int x = 0; x < w; x++) {
                    px[y * w + x] = (float) (bz + bs * ((Number) java.lang.reflect.Array.get(row, x)).doubleValue());
                }
            }
            return Image.wrap(w, h, px);
        }
    }

    /** Rows of a reference CSV: x_dao, y_dao, peak, flux, x_gauss, y_gauss, fwhm_gauss. */
    static List<double[]> golden(String name) {
        List<double[]> out = new ArrayList<>();
        for (String line : Reference.lines("golden/" + name)) {
            if (line.startsWith("#") || line.startsWith("x_")) {
                continue;
            }
            String[] f = line.split(",");
            double[] v = new double[f.length];
            for (int i = 0; i < f.length; i++) {
                v[i] = f[i].equalsIgnoreCase("nan") ? Double.NaN : Double.parseDouble(f[i]);
            }
            out.add(v);
        }
        return out;
    }

    /**
     * M51: the brightest star at (173.07, 93.60), FWHM 2.42 px by astropy's Gaussian2D fit; the same fit here on
     * the same 11×11 box, and the full pipeline finds it, measures it, and rejects the galaxy nucleus.
     */
    @Test
    void m51BrightestStarAndNucleus() throws Exception {
        assumeTrue(Files.isReadable(M51), "python3-skimage not installed");
        Image img = read(M51);
        List<double[]> ref = golden("real_stars_m51_simple.csv");
        double[] star = ref.get(0);
        // Same method as astropy: data − 85 (sigma-clipped median), 11×11 box, point-sampled Gaussian.
        int xi = (int) Math.round(star[0]);
        int yi = (int) Math.round(star[1]);
        float[] box = new float[121];
        for (int j = 0; j < 11; j++) {
            for (int i = 0; i < 11; i++) {
                box[j * 11 + i] = img.get(xi - 5 + i, yi - 5 + j) - 85f;
            }
        }
        StarProfile g = StarProfileFit.fitGaussian(box, 11, 11);
        // astropy's Gaussian2D has no constant term; ours has one, so allow the reference's 10 % here too but
        // check the centre tightly.
        assertEquals(star[4], g.x() + xi - 5, SAME_METHOD_POSITION_PX, "x vs astropy");
        assertEquals(star[5], g.y() + yi - 5, SAME_METHOD_POSITION_PX, "y vs astropy");
        assertEquals(star[6], g.fwhm(), PIPELINE_FWHM_REL * star[6], "FWHM vs astropy");

        StarMeasurement m = StarMeasurer.measure(img, MeasureSettings.defaults().withMinStars(3));
        MeasuredStar found = null;
        for (MeasuredStar s : m.stars()) {
            if (Math.hypot(s.x() - star[0], s.y() - star[1]) <= POSITION_PX) {
                found = s;
            }
        }
        assertTrue(found != null, "brightest star not accepted; detections " + m.detections().size()
                + ", rejected " + m.rejected());
        assertEquals(star[6], found.gaussian().fwhm(), PIPELINE_FWHM_REL * star[6], "pipeline FWHM");
        // The frame's brightest pixel (6630) is far below the int16 ceiling: nothing in it is saturated. Pinned
        // past failure: a faint knot at (180, 123) with three equal integer peak values was called saturated.
        assertEquals(0, m.rejected().get(RejectReason.SATURATED), "saturated detections in M51");
        double[] nucleus = ref.get(1);
        for (MeasuredStar s : m.stars()) {
            assertTrue(Math.hypot(s.x() - nucleus[0], s.y() - nucleus[1]) > NUCLEUS_PX, "galaxy nucleus accepted as a star");
        }
        // Isolated stars of the reference list that our pipeline accepted sit within 0.3 px of photutils.
        int matched = 0;
        for (int k = 2; k < 7; k++) {
            double[] r = ref.get(k);
            for (MeasuredStar s : m.stars()) {
                if (Math.hypot(s.x() - r[4], s.y() - r[5]) <= POSITION_PX) {
                    matched++;
                    assertEquals(r[6], s.gaussian().fwhm(), PIPELINE_FWHM_REL * r[6] + FAINT_REFERENCE_FWHM_PX, "FWHM of star " + k);
                }
            }
        }
        assertTrue(matched >= MIN_REFERENCE_STARS, "only " + matched + " of the reference stars 3..7 accepted");
    }

    /**
     * DSS crowded cutout: the ten brightest photutils DAOStarFinder sources (fwhm 3, 5σ) are among our
     * detections within 1 px (several are saturated: detection, not acceptance, is compared).
     */
    @Test
    void dssDetectionsMatchPhotutils() throws Exception {
        assumeTrue(Files.isReadable(DSS), "python3-astropy not installed");
        Image img = read(DSS);
        StarMeasurement m = StarMeasurer.measure(img,
                MeasureSettings.defaults().withMinStars(1).withBackground(BackgroundSettings.defaults().withMeshSize(25))
                        .withMinSeparation(2));
        int matched = 0;
        List<double[]> ref = golden("real_stars_dss_cutout.csv");
        for (double[] r : ref) {
            for (Detection d : m.detections()) {
                if (Math.hypot(d.x() - r[0], d.y() - r[1]) <= DETECTION_MATCH_PX) {
                    matched++;
                    break;
                }
            }
        }
        assertTrue(matched >= MIN_BRIGHTEST_MATCHED, matched + " of " + ref.size() + " matched; our detections: " + m.detections().size());
        // All 131 photutils sources (testdata stars/dss_cutout_dao.csv, same settings): the share we also detect.
        List<double[]> all = StarReference.rows("dss_cutout_dao.csv");
        int hit = 0;
        for (double[] r : all) {
            double best = 99;
            for (Detection d : m.detections()) {
                best = Math.min(best, Math.hypot(d.x() - r[0], d.y() - r[1]));
            }
            if (best <= DETECTION_MATCH_PX) {
                hit++;
            }
        }
        assertTrue(hit >= DSS_MATCHED * all.size(), hit + " of " + all.size() + " photutils sources matched");
    }
}
