package dev.nitid.fft;

import dev.nitid.image.Image;

/** The caller-mistake checks shared by the FFT plans, each message naming the value and the fix. */
final class Checks {
    private Checks() {
    }

    static void psfFits(Image psf, int width, int height, String what) {
        if (psf == null) {
            throw new IllegalArgumentException("PSF is null: pass a PSF image");
        }
        if (psf.width() > width || psf.height() > height) {
            throw new IllegalArgumentException("PSF is " + psf.width() + "x" + psf.height() + " but the "
                    + what + " is " + width + "x" + height + ": crop the PSF or pad the image");
        }
    }

    static double psfFinite(Image psf) {
        double sum = 0;
        float[] k = psf.plane(0);
        for (int i = 0; i < k.length; i++) {
            if (!Float.isFinite(k[i])) {
                throw new IllegalArgumentException("PSF pixel (" + (i % psf.width()) + ", " + (i / psf.width())
                        + ") is " + k[i] + ": a PSF must be finite everywhere (replace NaN/infinite pixels)");
            }
            sum += k[i];
        }
        return sum;
    }

    static void psfUsable(Image psf, int width, int height) {
        if (width < 1 || height < 1) {
            throw new IllegalArgumentException("image size " + width + "x" + height
                    + " is not positive: width and height must be at least 1");
        }
        psfFits(psf, width, height, "image");
        double sum = psfFinite(psf);
        if (sum == 0) {
            throw new IllegalArgumentException("PSF sums to 0: a PSF must have a non-zero total (normalise it to 1)");
        }
    }
}
