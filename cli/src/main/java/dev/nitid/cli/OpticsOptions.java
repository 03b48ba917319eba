package dev.nitid.cli;

import dev.nitid.psf.PupilPsf;
import dev.nitid.psf.Spectrum;
import dev.nitid.psf.Zernike;
import java.util.Map;
import java.util.TreeMap;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * The telescope options, declared once: {@code nitid measure} mixes them in directly (for its plate scale
 * and its optics/seeing/tracking split) and {@link PsfOptions} extends them (for {@code --model airy} in
 * {@code psf}, {@code sharpen} and {@code simulate}), so each name means the same thing in every command.
 * Parsing only: {@link #pupil(double, double, double)} builds the core model.
 */
public class OpticsOptions {
    /** Default wavelength without {@code --wavelength} or {@code --band}, nm. */
    static final double DEFAULT_WAVELENGTH_NM = 550;

    /** The command this mixin is part of: its {@link CommonOptions} give the thread count. */
    @Spec(Spec.Target.MIXEE)
    CommandSpec mixee;

    @Option(names = "--aperture", paramLabel = "MM", description = "Aperture diameter in mm (telescope optics).")
    Double aperture;

    @Option(names = "--obstruction", paramLabel = "RATIO",
            description = "Central obstruction diameter over aperture diameter, 0 <= ratio < 1 (default 0).")
    Double obstruction;

    @Option(names = "--vanes", paramLabel = "N", description = "Number of spider vanes (default 0).")
    Integer vanes;

    @Option(names = "--vane-width", paramLabel = "MM", description = "Width of each vane in mm (with --vanes).")
    Double vaneWidth;

    @Option(names = "--vane-angle", paramLabel = "DEG",
            description = "Angle of the first vane in degrees from +x towards +y (default 0).")
    Double vaneAngle;

    @Option(names = "--focal-length", paramLabel = "MM",
            description = "Focal length in mm; with --pixel-size it sets the plate scale.")
    Double focalLength;

    @Option(names = "--pixel-size", paramLabel = "UM",
            description = "Detector pixel pitch in micrometres (unbinned where the command has --binning).")
    Double pixelSize;

    @Option(names = "--wavelength", paramLabel = "NM",
            description = "Wavelength in nm for the optics (default 550 unless --band is given).")
    Double wavelength;

    @Option(names = "--band", paramLabel = "NM-NM",
            description = "Flat band in nm, e.g. 500-600, summed over at least 5 wavelengths with equal photon "
                    + "weights, instead of --wavelength.")
    String band;

    @Option(names = "--zernike", paramLabel = "J=W,...",
            description = "Aberrations as Noll index = waves RMS, e.g. 4=0.10,6=0.05 (4 defocus, 5-6 astigmatism, "
                    + "7-8 coma, 9-10 trefoil, 11 spherical).")
    String zernike;

    /**
     * The pupil model of these options: obstruction, vanes, spectrum and aberrations as given, rendered
     * with the command's {@code --threads}.
     *
     * @param apertureMm aperture diameter, mm
     * @param focalMm    focal length, mm
     * @param pixelUm    the (binned) detector pixel pitch, µm
     * @return the model
     * @throws IllegalArgumentException naming the option that is missing or out of range
     */
    PupilPsf pupil(double apertureMm, double focalMm, double pixelUm) {
        int n = vanes == null ? 0 : vanes;
        if (n > 0 && vaneWidth == null) {
            throw new IllegalArgumentException("--vanes " + n + " needs --vane-width (the width of one vane in mm)");
        }
        return new PupilPsf(apertureMm, obstruction == null ? 0 : obstruction, n, n > 0 ? vaneWidth : 0,
                vaneAngle == null ? 0 : vaneAngle, focalMm, pixelUm, spectrum(), parseZernike(zernike),
                PupilPsf.DEFAULT_PUPIL_SAMPLES, threads());
    }

    /**
     * The first option given among those that only describe the aperture and the light (everything but the
     * focal length and the pixel size), or null: for commands that must refuse them without an aperture.
     *
     * @return the option name, or null
     */
    String givenApertureOption() {
        Object[] values = {obstruction, vanes, vaneWidth, vaneAngle, wavelength, band, zernike};
        String[] names = {"--obstruction", "--vanes", "--vane-width", "--vane-angle", "--wavelength", "--band",
            "--zernike"};
        for (int i = 0; i < values.length; i++) {
            if (values[i] != null) {
                return names[i];
            }
        }
        return null;
    }

    /**
     * The command's {@code --threads} (through its {@link CommonOptions} mixin), so that pupil renders use no
     * more threads than asked.
     *
     * @return the thread count, or all available processors when the command has no common options
     */
    int threads() {
        if (mixee != null) {
            for (CommandSpec m : mixee.mixins().values()) {
                if (m.userObject() instanceof CommonOptions c) {
                    return c.threads();
                }
            }
        }
        return Runtime.getRuntime().availableProcessors();
    }

    Spectrum spectrum() {
        if (band != null && wavelength != null) {
            throw new IllegalArgumentException("--wavelength and --band both given (give one: a single wavelength or a band)");
        }
        if (band != null) {
            String[] parts = band.trim().split("-");
            try {
                if (parts.length != 2) {
                    throw new NumberFormatException();
                }
                return Spectrum.band(Double.parseDouble(parts[0].trim()), Double.parseDouble(parts[1].trim()));
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("--band is '" + band + "' (give two wavelengths in nm, e.g. --band 500-600)");
            }
        }
        return Spectrum.monochromatic(wavelength == null ? DEFAULT_WAVELENGTH_NM : wavelength);
    }

    static Zernike parseZernike(String text) {
        if (text == null || text.isBlank()) {
            return Zernike.none();
        }
        Map<Integer, Double> m = new TreeMap<>();
        for (String item : text.split(",")) {
            String[] kv = item.split("=");
            try {
                if (kv.length != 2) {
                    throw new NumberFormatException();
                }
                int j = Integer.parseInt(kv[0].trim());
                if (m.put(j, Double.parseDouble(kv[1].trim())) != null) {
                    throw new IllegalArgumentException("--zernike gives index " + j + " twice (give each index once)");
                }
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("--zernike item '" + item.trim()
                        + "' is not INDEX=WAVES (e.g. --zernike 4=0.10,6=0.05)");
            }
        }
        return Zernike.of(m);
    }
}
