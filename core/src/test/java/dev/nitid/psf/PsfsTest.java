package dev.nitid.psf;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import dev.nitid.testdata.ArrayAssert;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** Seeing and jitter, PSFs from pixels, plate scale and sampling figures. */
class PsfsTest {
    /**
     * FWHM of an Airy pattern convolved with a square pixel of 1/2.2 λ/D (the pupil of {@link #nyquistFlag()}
     * at 2.5 µm, f = 2000 mm), over the Airy FWHM: 2.340537 px / 2.263272 px = 1.0341, measured the way
     * {@link PsfFigures} does (diameter of the circle with the area of the half-maximum region) on a 1/40 px
     * grid by {@code testdata/scripts/derive_airy_pixel_fwhm.py} (scipy 1.10.1 j1, numpy 1.24.2). Rounded
     * up to 1.035. The Gaussian approximation of the core plus the pixel's variance 1/12 (Sheppard's
     * correction) gives 1.044 (derived here), the same size of effect; measured on the render: 1.0346.
     */
    static final double PIXEL_AIRY_FWHM_RATIO = 1.035;
    /**
     * Jitter and seeing kernels against the Gaussian whose variances add: 2e-4 of the peak, since the
     * kernel is point-sampled on the fine grid and renormalised (common practice, no source).
     */
    static final double BLUR_KERNEL_RTOL = 2e-4;
    /** Plate scale worked examples: 1e-9 relative, the reference README §4 tolerance for closed forms. */
    static final double PLATE_SCALE_RTOL = 1e-9;
    /**
     * Ratios of optical quantities computed in double along a different path from the test's (nm to mm,
     * products and quotients): a few ulps, 1e-12 relative (common practice, no source). (Was 1e-9.)
     */
    static final double DOUBLE_RTOL = 1e-12;
    /**
     * Sums and shares of a float32 stamp normalised to 1: each value carries at most 2⁻²⁴ of itself, so a
     * sum of positive values is off by at most 6e-8 (common practice, no source); 1e-6 allows the clipped
     * negative pixel and the float centroid. Measured ≤ 3.5e-8.
     */
    static final double FLOAT_STAMP_ATOL = 1e-6;
    /** "In the centre pixel": within half a pixel of its centre (definition). */
    static final double CENTRE_PIXEL_HALF_WIDTH = 0.5;

    /**
     * Gaussian ⊛ Gaussian is a Gaussian whose variances add (any probability text: the sum of independent
     * normal variables). Tolerance {@link #BLUR_KERNEL_RTOL} of the peak.
     */
    @Test
    void jitterOnGaussianAddsVariances() {
        double sigma = 1.5;
        double jitter = 1.0;
        PsfModel blurred = Psfs.withSeeingAndJitter(GaussianPsf.ofSigma(sigma), null, jitter, Double.NaN);
        Image got = blurred.render(31, 5, 0.2, -0.1);
        Image want = GaussianPsf.ofSigma(Math.hypot(sigma, jitter)).render(31, 5, 0.2, -0.1);
        double peak = want.stats(0).max();
        ArrayAssert.assertClose(want.plane(0), got.plane(0), 31, 0, BLUR_KERNEL_RTOL * peak);
    }

    /**
     * Seeing in arcsec goes through the plate scale 206.264806·p/f (reference README §4): Gaussian seeing of
     * 2″ at 0.775556″/px (3.76 µm, 1000 mm) on a 1-px-σ Gaussian gives σ² = 1 + (2/0.775556/2.35482)².
     */
    @Test
    void seeingInArcsecondsUsesThePlateScale() {
        double scale = Psfs.plateScaleArcsec(3.76, 1000);
        assertEquals(0.775555671489, scale, PLATE_SCALE_RTOL * scale, "constants.csv plate_scale_3.76um_1000mm");
        PsfModel m = Psfs.withSeeingAndJitter(GaussianPsf.ofSigma(1), Seeing.gaussian(2), 0, scale);
        double s2 = 2 / scale / GaussianPsf.FWHM_PER_SIGMA;
        Image want = GaussianPsf.ofSigma(Math.sqrt(1 + s2 * s2)).render(41, 3, 0, 0);
        Image got = m.render(41, 3, 0, 0);
        ArrayAssert.assertClose(want.plane(0), got.plane(0), 41, 0, BLUR_KERNEL_RTOL * want.stats(0).max());
        assertEquals(scale, m.plateScaleArcsec().orElseThrow(), DOUBLE_RTOL * scale);
        assertTrue(m.parameters().stream().anyMatch(p -> p.key().equals("SEEING")), "SEEING recorded");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Psfs.withSeeingAndJitter(GaussianPsf.ofSigma(1), Seeing.moffat(2), 0, Double.NaN));
        assertTrue(e.getMessage().contains("focal length"), e.getMessage());
    }

    /** Plate scale worked examples, reference README §4 (astropy.units 5.2.1), {@link #PLATE_SCALE_RTOL}. */
    @ParameterizedTest(name = "{0} um at {1} mm")
    @CsvSource({"3.76,1000,0.775555671489", "5.4,2000,0.556914976867", "9.0,530,3.5026099174", "2.4,400,1.23758883748"})
    void plateScaleExamples(double um, double mm, double expected) {
        assertEquals(expected, Psfs.plateScaleArcsec(um, mm), PLATE_SCALE_RTOL * expected);
    }

    /**
     * Nyquist sampling, reference README §4 worked example: D = 200 mm, f = 2000 mm, λ = 550 nm gives a
     * Nyquist pixel of 2.75 µm, so 3.76 µm pixels under-sample (ratio 3.76/2.75) and 2.5 µm ones do not.
     */
    @Test
    void nyquistFlag() {
        PupilPsf under = PupilPsf.of(200, 2000, 3.76, Spectrum.monochromatic(550));
        assertEquals(3.76 / 2.75, under.pixelOverNyquist().orElseThrow(), DOUBLE_RTOL * 3.76 / 2.75);
        assertEquals(5.5 / 3.76, under.lambdaOverDPixels(550), DOUBLE_RTOL * 5.5 / 3.76,
                "λN / pixel (constants.csv 1.46276595745)");
        PsfFigures f = PsfFigures.of(under.render(33), under);
        assertTrue(f.undersampled());
        assertTrue(f.warnings().stream().anyMatch(w -> w.contains("Nyquist")), f.warnings().toString());
        PupilPsf ok = under.withDetector(2000, 2.5);
        PsfFigures g = PsfFigures.of(ok.render(33), ok);
        assertFalse(g.undersampled());
        // Airy FWHM 1.028994 λ/D = 0.583674″ here (constants.csv); measured on the 5x-integrated render it is
        // the FWHM of the Airy core convolved with the pixel, so bounded below by the optics
        double airyFwhmArcsec = 0.58367441507;
        assertTrue(g.fwhmArcsec().orElseThrow() > airyFwhmArcsec, "pixel adds to the optical FWHM");
        // and above by the pixel-convolved Airy FWHM (PIXEL_AIRY_FWHM_RATIO) plus the 1 % measurement tolerance
        double upper = airyFwhmArcsec * PIXEL_AIRY_FWHM_RATIO * (1 + AnalyticModelsTest.MEASURED_FWHM_RTOL);
        assertTrue(g.fwhmArcsec().orElseThrow() < upper,
                "but not much at Nyquist: " + g.fwhmArcsec() + " vs at most " + upper);
    }

    @Test
    void fromImageRecentresNormalisesAndMakesOdd() {
        // an even-sized, off-centre Gaussian with a little negative noise
        Image raw = Image.create(20, 16);
        GaussianPsf g = GaussianPsf.ofSigma(1.2);
        for (int y = 0; y < 16; y++) {
            for (int x = 0; x < 20; x++) {
                raw.set(x, y, (float) (100 * g.value(x - 6.3, y - 9.0)));
            }
        }
        raw.set(0, 0, -0.01f * raw.get(6, 9));
        PreparedPsf p = Psfs.fromImage(raw);
        Image psf = p.psf();
        assertEquals(1, psf.width() % 2, "odd width");
        assertEquals(1, psf.height() % 2, "odd height");
        assertEquals(1, psf.stats(0).sum(), FLOAT_STAMP_ATOL, "sum 1");
        assertEquals(1, p.clippedPixels());
        assertTrue(p.warnings().stream().anyMatch(w -> w.contains("negative")), p.warnings().toString());
        PsfFigures f = PsfFigures.of(psf);
        assertEquals(psf.width() / 2, f.centroidX(), CENTRE_PIXEL_HALF_WIDTH, "centroid in the centre pixel (x)");
        assertEquals(psf.height() / 2, f.centroidY(), CENTRE_PIXEL_HALF_WIDTH, "centroid in the centre pixel (y)");
        assertEquals(f.centroidX() - psf.width() / 2, p.residualShiftX()[0], FLOAT_STAMP_ATOL,
                "residual shift reported");
        // nothing lost: the padded stamp keeps every input pixel, so the peak is the raw peak over the clipped sum
        double clippedSum = raw.stats(0).sum() - raw.get(0, 0);
        assertEquals(raw.get(6, 9) / clippedSum, psf.stats(0).max(), FLOAT_STAMP_ATOL * psf.stats(0).max(),
                "peak share kept");
        assertEquals(2.8257840540370566, f.fwhmPx(), AnalyticModelsTest.MEASURED_FWHM_RTOL * 2.8257840540370566,
                "FWHM 2.35482·1.2 kept (measured FWHM, σ ≥ 1 px: 1 %, reference README §3)");
    }

    @Test
    void fromImageHandlesCubesPlaneByPlane() {
        Image raw = Image.create(15, 15, 3);
        for (int p = 0; p < 3; p++) {
            GaussianPsf g = GaussianPsf.ofSigma(1 + 0.3 * p);
            for (int y = 0; y < 15; y++) {
                for (int x = 0; x < 15; x++) {
                    raw.set(p, x, y, (float) ((p + 1) * 7 * g.value(x - 7 + p, y - 7)));
                }
            }
        }
        PreparedPsf prepared = Psfs.fromImage(raw);
        assertEquals(3, prepared.psf().planes());
        for (int p = 0; p < 3; p++) {
            assertEquals(1, prepared.psf().stats(p).sum(), FLOAT_STAMP_ATOL, "plane " + p + " sum");
            PsfFigures f = PsfFigures.of(prepared.psf().planeImage(p));
            assertEquals(prepared.psf().width() / 2, f.centroidX(), CENTRE_PIXEL_HALF_WIDTH, "plane " + p + " centred");
        }
    }

    @Test
    void fromImageRefusesBadPsfs() {
        Image nan = Image.create(5, 5);
        nan.fill(1);
        nan.set(2, 3, Float.NaN);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Psfs.fromImage(nan));
        assertTrue(e.getMessage().contains("(2, 3)"), e.getMessage());
        Image zero = Image.create(5, 5);
        assertThrows(IllegalArgumentException.class, () -> Psfs.fromImage(zero));
        Image deep = Image.create(5, 5);
        deep.set(2, 2, 1);
        deep.set(0, 0, -0.5f);
        e = assertThrows(IllegalArgumentException.class, () -> Psfs.fromImage(deep));
        assertTrue(e.getMessage().contains("background"), e.getMessage());
    }
}
