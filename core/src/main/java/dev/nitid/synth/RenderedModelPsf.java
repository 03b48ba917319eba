package dev.nitid.synth;

import dev.nitid.psf.PsfModel;
import dev.nitid.psf.PsfParameter;
import java.util.Locale;

/**
 * Any {@link PsfModel} of the psf package (for example a {@code PupilPsf} with obstruction, vanes and
 * aberrations) as the PSF of a synthetic field: each star is rendered by
 * {@link PsfModel#render(int, int, double, double)} at its own sub-pixel phase, the same everywhere in the
 * field. Rendering cost is the model's per star; for expensive models with many stars, render once and use
 * {@link ImagePsf} (stars then sit on pixel centres).
 *
 * @param model      the model
 * @param size       stamp side, odd, ≥ 3
 * @param oversample sub-pixels per pixel per axis, 1 … {@link PsfModel#MAX_OVERSAMPLE}
 */
public record RenderedModelPsf(PsfModel model, int size, int oversample) implements FieldPsf {

    /** Validates the settings. */
    public RenderedModelPsf {
        if (model == null) {
            throw new IllegalArgumentException("PSF model is null: pass a model from dev.nitid.psf");
        }
        if (size < 3 || size % 2 == 0) {
            throw new IllegalArgumentException("PSF stamp size is " + size + ": use an odd size ≥ 3");
        }
        if (oversample < 1 || oversample > PsfModel.MAX_OVERSAMPLE) {
            throw new IllegalArgumentException("PSF oversampling is " + oversample + ": use 1 to " + PsfModel.MAX_OVERSAMPLE);
        }
    }

    @Override
    public boolean subPixel() {
        return true;
    }

    @Override
    public void render(double u, double v, double dx, double dy, float[] out) {
        float[] k = model.render(size, oversample, dx, dy).plane(0);
        System.arraycopy(k, 0, out, 0, k.length);
    }

    /** @return the model family and its first parameters as the psf package lists them, and the stamp side */
    @Override
    public String describe() {
        StringBuilder sb = new StringBuilder(model.family());
        int n = 0;
        for (PsfParameter p : model.parameters()) {
            if (p.key().equals("PSFMODEL") || n >= 4) {
                continue;
            }
            Object v = p.value();
            sb.append(n == 0 ? " " : ", ").append(p.key().toLowerCase(Locale.ROOT)).append(' ')
                    .append(v instanceof Double d ? String.format(Locale.ROOT, "%.4g", d) : String.valueOf(v));
            n++;
        }
        return sb.append(", stamp ").append(size).append(" px").toString();
    }
}
