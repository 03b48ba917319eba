package dev.nitid.fits;

import java.util.OptionalDouble;

/**
 * World-coordinate facts read from a header, following Greisen &amp; Calabretta 2002, "Representations of
 * world coordinates in FITS", A&amp;A 395, 1061 (Paper I), §2.1: the linear transformation is either the
 * {@code CDi_j} matrix, or {@code CDELTi} times the {@code PCi_j} matrix (unit matrix when absent).
 * Celestial axes are in degrees unless CUNITi says otherwise.
 */
public final class Wcs {
    private static final double ARCSEC_PER_DEG = 3600.0;

    private Wcs() {
    }

    /**
     * The mean pixel scale {@code sqrt(|det M|)} in arcseconds per pixel, where M is the 2×2 linear
     * transformation of axes 1 and 2 in degrees (Greisen &amp; Calabretta 2002, eq. 1–3; the square root of
     * the determinant is the geometric mean of the two axis scales, common practice).
     *
     * @param h the header (input, not modified)
     * @return the scale, or empty if axes 1 and 2 are neither a celestial pair (CTYPE) nor explicitly in
     *         degrees (CUNIT), have another unit, or have no usable CD or CDELT values
     */
    public static OptionalDouble pixelScaleArcsec(FitsHeader h) {
        // Axis values are angles in degrees when the units say so explicitly, or when the axes are a
        // celestial pair, whose default unit is the degree (Greisen & Calabretta 2002, §2.1.1; Calabretta &
        // Greisen 2002, §2). Other linear axes ('LINE', 'UNITLESS' ...) have no angular scale.
        boolean degrees = h.getString("CUNIT1").orElse("").trim().equalsIgnoreCase("deg")
                && h.getString("CUNIT2").orElse("").trim().equalsIgnoreCase("deg");
        if (!degrees && !celestial(h.getString("CTYPE1").orElse(""), h.getString("CTYPE2").orElse(""))) {
            return OptionalDouble.empty();
        }
        for (String axis : new String[] {"CUNIT1", "CUNIT2"}) {
            String u = h.getString(axis).orElse("deg").trim();
            if (!u.isEmpty() && !u.equalsIgnoreCase("deg")) {
                return OptionalDouble.empty();
            }
        }
        double[] m = new double[4];
        if (h.getDouble("CD1_1").isPresent() || h.getDouble("CD2_2").isPresent()) {
            m[0] = h.getDouble("CD1_1").orElse(0);
            m[1] = h.getDouble("CD1_2").orElse(0);
            m[2] = h.getDouble("CD2_1").orElse(0);
            m[3] = h.getDouble("CD2_2").orElse(0);
        } else if (h.getDouble("CDELT1").isPresent() && h.getDouble("CDELT2").isPresent()) {
            double c1 = h.getDouble("CDELT1").getAsDouble();
            double c2 = h.getDouble("CDELT2").getAsDouble();
            m[0] = c1 * h.getDouble("PC1_1").orElse(1);
            m[1] = c1 * h.getDouble("PC1_2").orElse(0);
            m[2] = c2 * h.getDouble("PC2_1").orElse(0);
            m[3] = c2 * h.getDouble("PC2_2").orElse(1);
        } else {
            return OptionalDouble.empty();
        }
        double det = Math.abs(m[0] * m[3] - m[1] * m[2]);
        if (!(det > 0) || !Double.isFinite(det)) {
            return OptionalDouble.empty();
        }
        return OptionalDouble.of(Math.sqrt(det) * ARCSEC_PER_DEG);
    }

    /**
     * True if the two axis types are a celestial longitude/latitude pair: {@code RA--}/{@code DEC-} or
     * {@code xLON}/{@code xLAT} in the first four characters (Calabretta &amp; Greisen 2002, A&amp;A 395,
     * 1077, §2), in either order.
     */
    static boolean celestial(String t1, String t2) {
        String a = (t1.trim() + "    ").substring(0, 4).toUpperCase(java.util.Locale.ROOT);
        String b = (t2.trim() + "    ").substring(0, 4).toUpperCase(java.util.Locale.ROOT);
        return isLon(a) && isLat(b) || isLon(b) && isLat(a);
    }

    private static boolean isLon(String t) {
        return t.equals("RA--") || t.endsWith("LON");
    }

    private static boolean isLat(String t) {
        return t.equals("DEC-") || t.endsWith("LAT");
    }
}
