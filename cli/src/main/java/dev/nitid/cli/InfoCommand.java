package dev.nitid.cli;

import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import dev.nitid.fits.ReadOptions;
import dev.nitid.fits.Wcs;
import dev.nitid.image.Image;
import dev.nitid.image.ImageStats;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code nitid info FILE [--hdu N] [--json]}: what a FITS file holds, the first thing to run on a new file.
 */
@Command(name = "info", mixinStandardHelpOptions = true,
        description = {"Shows what a FITS file holds: image size, planes, BITPIX, the HDU read,",
            "per-plane statistics (min, max, median, noise = 1.4826 x median absolute",
            "deviation, masked pixels) and the pixel scale when the header's WCS gives one."})
public final class InfoCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    CommonOptions common;

    @Parameters(index = "0", paramLabel = "FILE", description = "A FITS file (.fits, .fit, .fts, optionally .gz).")
    Path file;

    @Option(names = "--hdu", paramLabel = "N",
            description = "HDU to read: 0 = primary, 1 = first extension... Default: the first HDU with an image.")
    int hdu = -1;

    @Option(names = "--json", description = "Print one JSON object instead of text.")
    boolean json;

    @Override
    public Integer call() {
        return Failures.run(spec, common, () -> {
            if (hdu < -1) {
                throw new IllegalArgumentException("--hdu is " + hdu
                        + ", but HDUs are numbered from 0 (primary) (give 0 or more, or leave --hdu out)");
            }
            FitsImage fi = FitsReader.read(file, new ReadOptions(hdu));
            PrintWriter out = spec.commandLine().getOut();
            if (json) {
                out.println(json(fi));
            } else {
                text(out, fi);
            }
            out.flush();
            return ExitCode.OK;
        });
    }

    private void text(PrintWriter out, FitsImage fi) {
        Image img = fi.image();
        out.printf(Locale.ROOT, "file:        %s%n", file);
        out.printf(Locale.ROOT, "HDU:         %d (%s)%n", fi.hdu(), hduKind(fi));
        out.printf(Locale.ROOT, "size:        %d x %d pixels, %d plane%s%n", img.width(), img.height(),
                img.planes(), img.planes() == 1 ? "" : "s");
        out.printf(Locale.ROOT, "BITPIX:      %d (%s)%n", fi.bitpix(), typeName(fi));
        OptionalDouble scale = Wcs.pixelScaleArcsec(fi.header());
        out.printf(Locale.ROOT, "pixel scale: %s%n", scale.isPresent()
                ? String.format(Locale.ROOT, "%.4g arcsec/pixel (from the WCS)", scale.getAsDouble())
                : "unknown (no WCS scale in the header)");
        out.printf(Locale.ROOT, "masked:      %d pixel%s (NaN, infinity or BLANK)%n", fi.maskedPixels(),
                fi.maskedPixels() == 1 ? "" : "s");
        for (int p = 0; p < img.planes(); p++) {
            ImageStats s = img.stats(p);
            out.printf(Locale.ROOT, "plane %d:     min %s  max %s  median %s  noise %s  masked %d%n", p,
                    num(s.min()), num(s.max()), num(s.median()), num(s.madSigma()), s.nonFinite());
        }
    }

    private static String hduKind(FitsImage fi) {
        if (fi.hdu() == 0) {
            return "primary";
        }
        String name = fi.header().getString("EXTNAME").orElse("");
        return "IMAGE extension" + (name.isEmpty() ? "" : " " + name);
    }

    private static String typeName(FitsImage fi) {
        boolean scaled = fi.header().getDouble("BZERO").orElse(0) != 0
                || fi.header().getDouble("BSCALE").orElse(1) != 1;
        String base = switch (fi.bitpix()) {
            case 8 -> "8-bit unsigned integer";
            case 16 -> "16-bit integer";
            case 32 -> "32-bit integer";
            case 64 -> "64-bit integer";
            case -32 -> "32-bit float";
            default -> "64-bit float";
        };
        if (fi.bitpix() == 16 && fi.header().getDouble("BZERO").orElse(0) == 32768
                && fi.header().getDouble("BSCALE").orElse(1) == 1) {
            return "16-bit unsigned integer, stored with BZERO 32768";
        }
        return scaled ? base + ", scaled by BZERO/BSCALE" : base;
    }

    private static String num(double v) {
        return Double.isNaN(v) ? "n/a" : String.format(Locale.ROOT, "%.6g", v);
    }

    private String json(FitsImage fi) {
        Image img = fi.image();
        StringBuilder sb = new StringBuilder("{");
        sb.append("\"file\":").append(str(file.toString()));
        sb.append(",\"hdu\":").append(fi.hdu());
        sb.append(",\"width\":").append(img.width());
        sb.append(",\"height\":").append(img.height());
        sb.append(",\"planes\":").append(img.planes());
        sb.append(",\"bitpix\":").append(fi.bitpix());
        sb.append(",\"maskedPixels\":").append(fi.maskedPixels());
        OptionalDouble scale = Wcs.pixelScaleArcsec(fi.header());
        sb.append(",\"pixelScaleArcsec\":").append(scale.isPresent() ? jnum(scale.getAsDouble()) : "null");
        sb.append(",\"planeStats\":[");
        for (int p = 0; p < img.planes(); p++) {
            ImageStats s = img.stats(p);
            sb.append(p > 0 ? "," : "").append("{\"min\":").append(jnum(s.min()))
                    .append(",\"max\":").append(jnum(s.max()))
                    .append(",\"mean\":").append(jnum(s.mean()))
                    .append(",\"median\":").append(jnum(s.median()))
                    .append(",\"noise\":").append(jnum(s.madSigma()))
                    .append(",\"masked\":").append(s.nonFinite()).append('}');
        }
        return sb.append("]}").toString();
    }

    private static String jnum(double v) {
        return Double.isFinite(v) ? Double.toString(v) : "null";
    }

    private static String str(String s) {
        StringBuilder sb = new StringBuilder("\"");
        for (char c : s.toCharArray()) {
            switch (c) {
                case '"' -> sb.append("\\\"");
                case '\\' -> sb.append("\\\\");
                default -> {
                    if (c < 0x20) {
                        sb.append(String.format("\\u%04x", (int) c));
                    } else {
                        sb.append(c);
                    }
                }
            }
        }
        return sb.append('"').toString();
    }
}
