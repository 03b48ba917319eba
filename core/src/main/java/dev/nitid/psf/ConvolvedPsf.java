package dev.nitid.psf;

import dev.nitid.fft.Boundary;
import dev.nitid.fft.ConvolutionSettings;
import dev.nitid.fft.Convolver;
import dev.nitid.image.Image;
import dev.nitid.psf.internal.Grids;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;

/**
 * A PSF convolved with blur kernels (seeing, tracking jitter): {@code P = base ⊛ k1 ⊛ k2 …}.
 *
 * <p>The convolution is done on the fine grid, before binning, so pixel integration stays exact in the
 * limit of fine oversampling (the pixel box is one more convolution and they commute). The base is
 * rendered on a stamp enlarged by a margin of about four kernel FWHMs on every side (at most half the
 * stamp) so that light scattered into the stamp from outside is kept; each kernel is point-sampled on the
 * fine grid over that margin and normalised to unit sum (the energy beyond the margin is re-assigned,
 * project choice); several kernels are first blurred into one, then the stamp is convolved once with the
 * FFT engine's {@link Convolver} (zero boundary).
 *
 * @param base    the model to blur
 * @param kernels blur kernels in pixels (at least one)
 * @param blurParameters header parameters describing the blur (seeing, jitter)
 * @param plateScale     arcsec per pixel if known (NaN otherwise), reported by {@link #plateScaleArcsec()}
 * @param threads        worker threads of the convolution, ≥ 1 (the base renders with its own settings;
 *                       the result does not depend on it, {@link Convolver}; as a record component it takes
 *                       part in {@code equals})
 */
public record ConvolvedPsf(PsfModel base, List<AnalyticPsf> kernels, List<PsfParameter> blurParameters,
                           double plateScale, int threads) implements PsfModel {

    /**
     * Margin around the stamp in kernel FWHMs: a β = 4.765 Moffat holds 1 − 1.2e-4 of its flux within 4 FWHM
     * (EE(r) = 1 − (1 + r²/α²)^(1−β), Trujillo et al. 2001), a β = 2.5 one 0.990.
     */
    public static final double MARGIN_FWHM = 4;

    /** Validates and copies the lists. */
    public ConvolvedPsf {
        if (base == null) {
            throw new IllegalArgumentException("base PSF is null");
        }
        if (kernels == null || kernels.isEmpty()) {
            throw new IllegalArgumentException("no blur kernel given: pass at least one");
        }
        kernels = List.copyOf(kernels);
        blurParameters = blurParameters == null ? List.of() : List.copyOf(blurParameters);
        if (threads < 1) {
            throw new IllegalArgumentException("threads " + threads + " must be at least 1");
        }
    }

    /**
     * A blurred PSF whose convolution uses all available processors.
     *
     * @param base           the model to blur
     * @param kernels        blur kernels in pixels (at least one)
     * @param blurParameters header parameters describing the blur
     * @param plateScale     arcsec per pixel if known, else NaN
     */
    public ConvolvedPsf(PsfModel base, List<AnalyticPsf> kernels, List<PsfParameter> blurParameters,
                        double plateScale) {
        this(base, kernels, blurParameters, plateScale, Runtime.getRuntime().availableProcessors());
    }

    /**
     * @param n worker threads of the convolution, ≥ 1
     * @return this PSF convolved with {@code n} threads (the base keeps its own settings)
     */
    public ConvolvedPsf withThreads(int n) {
        return new ConvolvedPsf(base, kernels, blurParameters, plateScale, n);
    }

    @Override
    public Image renderOversampled(int size, int oversample, double dx, double dy) {
        Grids.checkRender(size, oversample, dx, dy);
        double widest = 0;
        for (AnalyticPsf k : kernels) {
            widest = Math.max(widest, kernelFwhm(k));
        }
        int pad = (int) Math.min(size / 2, Math.ceil(MARGIN_FWHM * widest));
        int big = size + 2 * pad;
        Image fine = base.renderOversampled(big, oversample, dx, dy);
        int nb = big * oversample;
        float[] work = fine.plane(0);
        int h = pad * oversample;
        if (h > 0) {
            ConvolutionSettings zero = ConvolutionSettings.defaults().withBoundary(Boundary.ZERO).withThreads(threads);
            // Blur the kernels into one on the margin's support first (small), then convolve the stamp once.
            Image ker = sampleKernel(kernels.get(0), h, oversample);
            int kn = 2 * h + 1;
            for (int i = 1; i < kernels.size(); i++) {
                float[] both = new float[kn * kn];
                Convolver.create(kn, kn, sampleKernel(kernels.get(i), h, oversample), zero).convolve(ker.plane(0), both);
                double[] acc = new double[kn * kn];
                for (int j = 0; j < acc.length; j++) {
                    acc[j] = both[j];
                }
                ker = Grids.normalise(acc, kn, kn);
            }
            float[] out = new float[nb * nb];
            Convolver.create(nb, nb, ker, zero).convolve(work, out);
            work = out;
        }
        int n = size * oversample;
        float[] crop = new float[n * n];
        for (int y = 0; y < n; y++) {
            System.arraycopy(work, (y + h) * nb + h, crop, y * n, n);
        }
        return Image.wrap(n, n, crop);
    }

    private static double kernelFwhm(AnalyticPsf k) {
        if (k instanceof GaussianPsf g) {
            return g.fwhmMajor();
        }
        if (k instanceof MoffatPsf m) {
            return m.fwhmMajor();
        }
        return 3;
    }

    /** Point samples of the kernel at fine offsets −h…h (fine units), normalised to sum 1. */
    private static Image sampleKernel(AnalyticPsf k, int h, int oversample) {
        int n = 2 * h + 1;
        double[] acc = new double[n * n];
        for (int j = 0; j < n; j++) {
            double y = (j - h) / (double) oversample;
            for (int i = 0; i < n; i++) {
                acc[j * n + i] = k.value((i - h) / (double) oversample, y);
            }
        }
        return Grids.normalise(acc, n, n);
    }

    @Override
    public String description() {
        StringBuilder sb = new StringBuilder(base.description());
        for (PsfParameter p : blurParameters) {
            if (p.key().equals("SEEING")) {
                sb.append(", seeing ").append(Psfs.num((Double) p.value())).append(" arcsec");
            } else if (p.key().equals("SEEPROF")) {
                sb.append(' ').append(p.value());
            } else if (p.key().equals("JITTER")) {
                sb.append(", jitter ").append(Psfs.num((Double) p.value())).append(" px");
            }
        }
        return sb.toString();
    }

    @Override
    public String family() {
        return base.family();
    }

    @Override
    public List<PsfParameter> parameters() {
        List<PsfParameter> p = new ArrayList<>(base.parameters());
        p.addAll(blurParameters);
        return p;
    }

    @Override
    public OptionalDouble plateScaleArcsec() {
        return Double.isFinite(plateScale) ? OptionalDouble.of(plateScale) : base.plateScaleArcsec();
    }

    /** @return the base model's optical Strehl ratio: seeing and jitter are not aberrations of the optics */
    @Override
    public OptionalDouble strehl() {
        return base.strehl();
    }

    @Override
    public OptionalDouble pixelOverNyquist() {
        return base.pixelOverNyquist();
    }
}
