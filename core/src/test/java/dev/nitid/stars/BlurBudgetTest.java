package dev.nitid.stars;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import dev.nitid.psf.ConvolvedPsf;
import dev.nitid.psf.GaussianPsf;
import dev.nitid.psf.PsfModel;
import dev.nitid.psf.PupilPsf;
import dev.nitid.psf.Seeing;
import dev.nitid.psf.Spectrum;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Round trip through the forward model (STYLE.md: build the truth, blur, invert, compare): a PSF made of known
 * optics, seeing and tracking is measured like a star, and the split must give back the seeing and the
 * tracking it was made with.
 */
class BlurBudgetTest {
    /** Bisection and profile-fit noise on noise-free renders: a few tenths of a percent; 2 % is the FWHM figure of issue 6. */
    private static final double REL = 0.02;
    /**
     * Tracking: the trail is found from the major axis after the round parts are removed, a difference of two
     * nearly equal widths, so it is known ~5× less well than the seeing (project target, no source).
     */
    private static final double TRACKING_REL = 0.10;
    /** The three shares are fractions of one sum: equal to 1 up to double rounding. */
    private static final double SHARES_SUM_TOL = 1e-12;
    /** Optics wider than the stars: the optics carry nearly all the blur (project choice, no source). */
    private static final double MIN_OPTICS_SHARE = 0.9;
    /** Airy FWHM against 1.028994 λ/D: a profile fit of the pupil-FFT PSF sampled at ~2.9 px per λ/D (project target, no source). */
    private static final double AIRY_FWHM_REL = 0.01;

    static ProfileSummary summaryOf(Image img, ProfileShape shape) {
        StarProfile p = StarProfileFit.fit(img.plane(0), null, img.width(), img.height(), shape,
                ProfileFitSettings.defaults().withSampling(PixelSampling.INTEGRATED));
        return new ProfileSummary(shape, 1, p.fwhm(), 0, p.fwhmMajor(), p.fwhmMinor(), p.ellipticity(), 0,
                p.angle(), p.beta(), 0, 0);
    }

    @Test
    void recoversSeeingAndTracking() {
        // Invented instrument: 200 mm aperture, ε = 0.3, f = 1000 mm, 3.76 µm pixels, 550 nm.
        PsfModel optics = PupilPsf.of(200, 1000, 3.76, Spectrum.monochromatic(550)).withObstruction(0.3);
        double scale = PlateScale.fromOptics(3.76, 1000, 1, "test").arcsecPerPixel();
        double seeing = 2.2;
        double tracking = 2.0;
        double angleDeg = 30;
        // The trail is 0.3 px wide across and rendered on a 1/10-px grid so that it is well sampled.
        PsfModel truth = new ConvolvedPsf(optics, List.of(Seeing.moffat(seeing).kernel(scale),
                new GaussianPsf(tracking, 0.3, angleDeg)), List.of(), scale);
        Image img = truth.render(31, 10, 0, 0);
        ProfileSummary measured = summaryOf(img, ProfileShape.MOFFAT);
        BlurSplit split = BlurBudget.split(measured, optics, scale, PixelSampling.INTEGRATED, 15);
        assertEquals(seeing, split.seeingFwhmArcsec(), REL * seeing, "seeing");
        assertEquals(tracking, split.trackingFwhmPx(), TRACKING_REL * tracking, "tracking");
        assertEquals(1, split.opticsShare() + split.seeingShare() + split.trackingShare(), SHARES_SUM_TOL, "shares");
        assertEquals(measured.fwhmMajor(), split.modelMajorPx(), REL * measured.fwhmMajor(), "model major");
        assertTrue(split.seeingShare() > split.opticsShare(), "seeing dominates a 200 mm aperture at 2.2\"");
    }

    @Test
    void opticsWiderThanStarsMeansNoSeeing() {
        PsfModel optics = PupilPsf.of(50, 1000, 3.76, Spectrum.monochromatic(550));
        double scale = PlateScale.fromOptics(3.76, 1000, 1, "test").arcsecPerPixel();
        Image img = optics.render(31);
        ProfileSummary measured = summaryOf(img, ProfileShape.GAUSSIAN);
        BlurSplit split = BlurBudget.split(measured, optics, scale, PixelSampling.INTEGRATED, 15);
        assertEquals(0, split.seeingFwhmArcsec(), REL * split.opticsFwhmPx() * scale, "no seeing");
        assertTrue(split.opticsShare() > MIN_OPTICS_SHARE, "optics share " + split.opticsShare());
        // Airy FWHM = 1.028994 λ/D (reference README §1, scipy): λ/D = 550e-9/0.05 rad, at 206.264806·3.76/1000 ″/px.
        double lambdaOverDPx = 550e-9 / 0.050 * 206264.806 / scale;
        assertEquals(1.028994 * lambdaOverDPx, split.opticsFwhmPx(), AIRY_FWHM_REL * 1.028994 * lambdaOverDPx, "Airy FWHM");
    }
}
