package dev.nitid.stars;

import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsImage;
import dev.nitid.image.Image;
import dev.nitid.stars.fit.FitSettings;
import dev.nitid.stars.internal.EllipticalProfileModel;
import dev.nitid.stars.internal.Parallel;
import dev.nitid.image.internal.Select;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Finds, selects and measures the stars of an image, and builds its PSF.
 *
 * <ol>
 *   <li>Background and noise: {@link BackgroundMap} (sigma-clipped mesh, σ = 1.4826·MAD).</li>
 *   <li>Detection: the background-subtracted image is correlated with a unit-sum Gaussian of
 *       {@code detectionFwhm} (a matched filter for Gaussian-like stars in white noise; Irwin 1985,
 *       MNRAS 214, 575; Stetson 1987, PASP 99, 191, §III); a pixel is a candidate if the filtered value
 *       exceeds {@code k·σ·Σg₁²} — the filtered noise for white noise of σ, with g₁ the 1-D kernel — and
 *       it is the largest within {@code minSeparation} pixels. A second look with the zero-sum ("lowered")
 *       Gaussian of the same width (Stetson 1987, §III) adds companions that the unit-sum filter turns into a
 *       shoulder on a brighter star's wing; they are rejected as blends below like any close pair.</li>
 *   <li>Cheap rejection, in this order: edge, masked core, saturation (level or flat top), blend, sharpness
 *       ({@code 1 − mean(4 neighbours)/peak}, after Stetson 1987's idea of a sharpness statistic).</li>
 *   <li>Fits: elliptical Gaussian and Moffat + constant by Levenberg–Marquardt ({@link StarProfileFit}) on
 *       (2r+1)² stamps of the background-subtracted image; failed fits are rejected.</li>
 *   <li>Shape rejection: FWHM below {@code max(minFwhm, sharpFactor·median)} (hot pixels, cosmic rays)
 *       or above {@code extendedFactor·median} (galaxies, nebula knots), median recomputed once.</li>
 *   <li>Robust aggregation (median, 1.4826·MAD), best shape by BIC, field grid, empirical and model PSF.</li>
 * </ol>
 *
 * <p>Stateless and thread-safe; results are identical for any thread count.
 */
public final class StarMeasurer {
    /** Solver settings for star fits: fewer steps than the general default; stars converge in ~10. */
    private static final FitSettings STAR_SOLVER = FitSettings.defaults().withMaxIterations(100)
            .withTolerances(1e-9, 1e-8);
    /** Half-size of the core box checked for saturation and masked pixels (5×5 core). */
    private static final int CORE = 2;
    /**
     * A flat top counts as saturation only at or above this fraction of the frame's brightest pixel: clipped
     * stars sit at the frame's ceiling, while faint stars in integer data often have a few equal peak values.
     */
    private static final double FLAT_TOP_FRACTION = 0.5;
    /** Fewest equal peak pixels that mark a flat (clipped) top. */
    private static final int FLAT_TOP_PIXELS = 3;

    private StarMeasurer() {
    }

    /**
     * Measures plane 0 of an image (for colour images, pass a luminance plane).
     *
     * @param image    the image (input, not modified)
     * @param settings thresholds and options
     * @return the measurement
     */
    public static StarMeasurement measure(Image image, MeasureSettings settings) {
        return measure(image.plane(0), image.width(), image.height(), settings);
    }

    /**
     * Measures a frame read from FITS: colour planes are averaged into one luminance plane, and when
     * {@code settings.saturation()} is NaN the level comes from {@link #saturationLevel}.
     *
     * @param frame    the frame (input, not modified)
     * @param settings thresholds and options
     * @return the measurement
     */
    public static StarMeasurement measure(FitsImage frame, MeasureSettings settings) {
        MeasureSettings s = settings;
        if (Double.isNaN(s.saturation())) {
            java.util.OptionalDouble sat = saturationLevel(frame.header(), frame.bitpix());
            if (sat.isPresent()) {
                s = s.withSaturation(sat.getAsDouble());
            }
        }
        return measure(luminance(frame.image()), s);
    }

    /**
     * The saturation level a header implies: the {@code SATURATE} keyword (common in survey and
     * observatory pipelines, no standard) if present, else the ceiling of the integer data type after
     * scaling, {@code BZERO + BSCALE·(2^(BITPIX−1) − 1)} (unsigned 8-bit: 255·BSCALE + BZERO; FITS
     * standard 4.0 §5.2.5), minus one step since converters often clip one count below the ceiling.
     * Floating-point data have no ceiling.
     *
     * @param h      header (input, not modified)
     * @param bitpix BITPIX of the data
     * @return the level, or empty when unknown
     * @throws IllegalArgumentException if SATURATE, BZERO or BSCALE holds something that is not a FITS
     *                                  number (FITS Standard 4.0 §4.2.3–4.2.4): falling back to the type
     *                                  ceiling would let saturated stars through unnoticed
     */
    public static java.util.OptionalDouble saturationLevel(FitsHeader h, int bitpix) {
        for (String key : new String[] {"SATURATE", "BZERO", "BSCALE"}) {
            java.util.Optional<String> bad = h.malformedNumber(key);
            if (bad.isPresent()) {
                throw new IllegalArgumentException(key + " is " + bad.get() + ", not a number (FITS Standard 4.0 "
                        + "§4.2.3-4.2.4), so the saturation level is unknown: correct or remove the card, or give "
                        + "the saturation level explicitly");
            }
        }
        java.util.OptionalDouble sat = h.getDouble("SATURATE");
        if (sat.isPresent()) {
            return sat;
        }
        if (bitpix < 0) {
            return java.util.OptionalDouble.empty();
        }
        double bz = h.getDouble("BZERO").orElse(0);
        double bs = h.getDouble("BSCALE").orElse(1);
        double rawMax = bitpix == 8 ? 255 : Math.pow(2, bitpix - 1) - 1;
        return java.util.OptionalDouble.of(bz + bs * (rawMax - 1));
    }

    /**
     * One plane to measure: the plane itself, or the mean of the planes of a colour image.
     *
     * @param image the image (input, not modified)
     * @return plane 0 (shared, not copied) or a new mean plane
     */
    public static Image luminance(Image image) {
        if (image.planes() == 1) {
            return image;
        }
        float[] out = new float[image.pixelCount()];
        for (int p = 0; p < image.planes(); p++) {
            float[] a = image.plane(p);
            for (int i = 0; i < out.length; i++) {
                out[i] += a[i] / image.planes();
            }
        }
        return Image.wrap(image.width(), image.height(), out);
    }

    /** A local maximum of the filtered image. */
    private record Candidate(int x, int y, float filtered, int index, double significance, double subX, double subY) {
    }

    /**
     * Measures the stars of one plane.
     *
     * @param pixels   row-major pixels, NaN = masked (input, not modified)
     * @param width    columns
     * @param height   rows
     * @param settings thresholds and options
     * @return the measurement
     */
    public static StarMeasurement measure(float[] pixels, int width, int height, MeasureSettings settings) {
        if (pixels.length != (long) width * height) {
            throw new IllegalArgumentException("pixels has " + pixels.length + " values for a " + width + "x"
                    + height + " image: pass width*height pixels");
        }
        final MeasureSettings s = settings;
        final int threads = s.threads();
        Map<String, Long> timings = new LinkedHashMap<>();
        long t0 = System.nanoTime();

        BackgroundMap bg = BackgroundMap.estimate(pixels, width, height, s.background(), threads);
        float[] resid = new float[pixels.length];
        bg.subtract(pixels, resid, threads);
        long t1 = System.nanoTime();
        timings.put("background", (t1 - t0) / 1_000_000);

        List<Candidate> cands = detect(resid, width, height, bg, s);
        long t2 = System.nanoTime();
        timings.put("detection", (t2 - t1) / 1_000_000);

        EnumMap<RejectReason, Integer> rejected = new EnumMap<>(RejectReason.class);
        for (RejectReason r : RejectReason.values()) {
            rejected.put(r, 0);
        }
        int R = s.stampRadius();
        CandidateGrid grid = new CandidateGrid(cands, width, height, R + 1);
        List<Candidate> toFit = new ArrayList<>();
        List<Integer> fitOrdinal = new ArrayList<>();
        RejectReason[] fate = new RejectReason[cands.size()];
        double[][] where = new double[cands.size()][];
        int skipped = 0;
        float frameMax = Float.NEGATIVE_INFINITY;
        for (float v : pixels) {
            if (v > frameMax) {
                frameMax = v;
            }
        }
        for (int ci = 0; ci < cands.size(); ci++) {
            Candidate c = cands.get(ci);
            where[ci] = new double[] {c.subX(), c.subY()};
            RejectReason why = cheapReject(c, pixels, resid, width, height, grid, s, frameMax);
            if (why != null) {
                rejected.merge(why, 1, Integer::sum);
                fate[ci] = why;
            } else if (toFit.size() < s.maxStars()) {
                toFit.add(c);
                fitOrdinal.add(ci);
            } else {
                skipped++;
            }
        }

        int size = 2 * R + 1;
        ProfileFitSettings pfs = new ProfileFitSettings(s.sampling(), STAR_SOLVER);
        MeasuredStar[] fits = new MeasuredStar[toFit.size()];
        boolean[] faint = new boolean[toFit.size()];
        float[][] stampBuf = new float[threads][size * size];
        Parallel.forEach(toFit.size(), threads, (i, worker) -> {
            Candidate c = toFit.get(i);
            float[] st = stampBuf[worker];
            int x0 = c.x() - R;
            int y0 = c.y() - R;
            for (int j = 0; j < size; j++) {
                System.arraycopy(resid, (y0 + j) * width + x0, st, j * size, size);
            }
            StarProfile gStamp;
            try {
                gStamp = StarProfileFit.fit(st, null, size, size, ProfileShape.GAUSSIAN, pfs);
            } catch (IllegalArgumentException e) {
                return;
            }
            double local = bg.levelAt(c.x(), c.y());
            StarProfile g = shift(gStamp, x0, y0, local);
            if (!plausible(g, c, R, s)) {
                return;
            }
            double noise = bg.noiseAt(c.x(), c.y());
            boolean tooFaint = g.amplitude() < s.minPeakSnr() * noise;
            StarProfile m = null;
            // The Moffat fit costs most of the time and is used only for accepted stars: a star that the
            // Gaussian fit already rejects (implausible, too faint) does not get one.
            if (!tooFaint) {
                m = shift(StarProfileFit.fitMoffatFrom(gStamp, st, null, size, size, pfs), x0, y0, local);
                if (!plausible(m, c, R, s) || !(m.beta() < 0.999 * EllipticalProfileModel.MAX_BETA)) {
                    m = null;
                }
            }
            fits[i] = new MeasuredStar(g.x(), g.y(), g.amplitude() / noise, g, m, 0);
            faint[i] = tooFaint;
        });
        List<MeasuredStar> good = new ArrayList<>();
        java.util.Map<MeasuredStar, Integer> ordinalOf = new java.util.IdentityHashMap<>();
        for (int i = 0; i < fits.length; i++) {
            MeasuredStar f = fits[i];
            int ci = fitOrdinal.get(i);
            if (f == null) {
                rejected.merge(RejectReason.FIT_FAILED, 1, Integer::sum);
                fate[ci] = RejectReason.FIT_FAILED;
                continue;
            }
            where[ci] = new double[] {f.x(), f.y()};
            ordinalOf.put(f, ci);
            if (faint[i]) {
                rejected.merge(RejectReason.FAINT, 1, Integer::sum);
                fate[ci] = RejectReason.FAINT;
            } else {
                good.add(f);
            }
        }
        long t3 = System.nanoTime();
        timings.put("fits", (t3 - t2) / 1_000_000);

        // Shape rejection against a reference FWHM: the median over the highest-S/N fitted stars (galaxies and
        // knots crowd the faint end), recomputed once on the survivors.
        List<MeasuredStar> accepted = good;
        double ref = referenceFwhm(good, s.referenceStars());
        for (int pass = 0; pass < 2 && !accepted.isEmpty(); pass++) {
            double lo = Math.max(s.minFwhm(), s.sharpFactor() * ref);
            double hi = s.extendedFactor() * ref;
            List<MeasuredStar> keep = new ArrayList<>();
            for (MeasuredStar m : good) {
                double f = m.gaussian().fwhm();
                if (f >= lo && f <= hi) {
                    keep.add(m);
                }
            }
            accepted = keep;
            if (!keep.isEmpty()) {
                ref = referenceFwhm(keep, s.referenceStars());
            }
        }
        if (!good.isEmpty()) {
            double lo = Math.max(s.minFwhm(), s.sharpFactor() * ref);
            java.util.Set<MeasuredStar> kept = Collections.newSetFromMap(new java.util.IdentityHashMap<>());
            kept.addAll(accepted);
            for (MeasuredStar m : good) {
                if (!kept.contains(m)) {
                    RejectReason why = m.gaussian().fwhm() < lo ? RejectReason.TOO_SHARP : RejectReason.EXTENDED;
                    rejected.merge(why, 1, Integer::sum);
                    fate[ordinalOf.get(m)] = why;
                }
            }
        }

        ProfileSummary gs = summarise(ProfileShape.GAUSSIAN, accepted, bg);
        ProfileSummary ms = summarise(ProfileShape.MOFFAT, accepted, bg);
        ProfileShape best = ms.count() >= Math.max(1, gs.count() / 2) && ms.bic() < gs.bic()
                ? ProfileShape.MOFFAT : ProfileShape.GAUSSIAN;

        int gc = s.gridColumns();
        int gr = s.gridRows();
        boolean[] isAccepted = new boolean[cands.size()];
        for (MeasuredStar m : accepted) {
            isAccepted[ordinalOf.get(m)] = true;
        }
        List<Detection> detections = new ArrayList<>(cands.size());
        for (int ci = 0; ci < cands.size(); ci++) {
            detections.add(new Detection(where[ci][0], where[ci][1], cands.get(ci).significance(), isAccepted[ci],
                    fate[ci]));
        }
        List<MeasuredStar> stars = new ArrayList<>(accepted.size());
        for (MeasuredStar m : accepted) {
            StarProfile p = m.profile(best) != null ? m.profile(best) : m.gaussian();
            int col = Math.min(gc - 1, (int) Math.floor(Math.max(0, p.x()) * gc / width));
            int row = Math.min(gr - 1, (int) Math.floor(Math.max(0, p.y()) * gr / height));
            stars.add(new MeasuredStar(p.x(), p.y(), m.snr(), m.gaussian(), m.moffat(), row * gc + col));
        }
        List<RegionSummary> regions = regions(stars, best, width, height, gc, gr);

        EmpiricalPsf emp = EmpiricalPsfBuilder.build(stars, best, resid, width, height, bg, s);
        ProfileSummary b = best == ProfileShape.MOFFAT ? ms : gs;
        Image model = null;
        if (b.count() > 0) {
            double minor = Math.min(b.fwhmMinor(), b.fwhmMajor());
            model = FittedProfilePsf.render(best, b.fwhmMajor(), minor, b.angle(), b.beta(), R);
        }
        double mismatch = emp != null && model != null ? mismatch(emp, model) : Double.NaN;
        PsfSource source;
        String reason;
        String shapeName = best.name().toLowerCase(java.util.Locale.ROOT);
        if (emp == null) {
            source = PsfSource.MODEL;
            reason = "fitted " + shapeName + " model: no star could be stacked into an empirical PSF";
        } else if (emp.starsUsed() < s.minEmpiricalStars() || emp.noiseToPeak() > s.maxEmpiricalNoise()) {
            source = PsfSource.MODEL;
            reason = String.format(java.util.Locale.ROOT,
                    "fitted %s model: the empirical PSF from %d stars has noise %.2f%% of its peak "
                            + "(it needs at least %d stars and at most %.2f%%)",
                    shapeName, emp.starsUsed(), 100 * emp.noiseToPeak(), s.minEmpiricalStars(),
                    100 * s.maxEmpiricalNoise());
        } else if (!(mismatch > s.minModelMismatch())) {
            source = PsfSource.MODEL;
            reason = String.format(java.util.Locale.ROOT,
                    "fitted %s model: it matches the empirical PSF from %d stars within %.1f times the "
                            + "empirical PSF's noise (limit %.1f), and it has no noise",
                    shapeName, emp.starsUsed(), mismatch, s.minModelMismatch());
        } else {
            source = PsfSource.EMPIRICAL;
            reason = String.format(java.util.Locale.ROOT,
                    "empirical PSF from %d stars: it differs from the best %s model by %.1f times its noise "
                            + "(limit %.1f), noise %.2f%% of its peak",
                    emp.starsUsed(), shapeName, mismatch, s.minModelMismatch(), 100 * emp.noiseToPeak());
        }
        long t4 = System.nanoTime();
        timings.put("psf", (t4 - t3) / 1_000_000);
        timings.put("total", (t4 - t0) / 1_000_000);
        return new StarMeasurement(width, height, Collections.unmodifiableList(detections), toFit.size(),
                Collections.unmodifiableList(stars),
                Collections.unmodifiableMap(rejected), skipped, bg.globalLevel(), bg.globalNoise(), gs, ms, best,
                Collections.unmodifiableList(regions), gc, gr, emp, model, mismatch, source, reason,
                Collections.unmodifiableMap(timings), stars.size() >= s.minStars(), bg);
    }

    /** Median Gaussian FWHM of the {@code count} highest-S/N stars (ties keep list order). */
    private static double referenceFwhm(List<MeasuredStar> stars, int count) {
        List<MeasuredStar> bySnr = new ArrayList<>(stars);
        bySnr.sort((a, b) -> Double.compare(b.snr(), a.snr()));
        return Select.median(bySnr.subList(0, Math.min(count, bySnr.size())).stream()
                .mapToDouble(m -> m.gaussian().fwhm()).toArray());
    }

    /**
     * RMS difference between the empirical and the model PSF over the core (model ≥ 1 % of its peak), in
     * units of the empirical PSF's per-node noise.
     */
    static double mismatch(EmpiricalPsf emp, Image model) {
        float[] e = emp.sampled().plane(0);
        float[] m = model.plane(0);
        float[] sd = emp.noise().plane(0);
        if (e.length != m.length) {
            return Double.NaN;
        }
        double peak = 0;
        for (float v : m) {
            peak = Math.max(peak, v);
        }
        double ss = 0;
        double nn = 0;
        for (int i = 0; i < m.length; i++) {
            if (m[i] >= 0.01 * peak) {
                double d = e[i] - m[i];
                ss += d * d;
                nn += (double) sd[i] * sd[i];
            }
        }
        return nn > 0 ? Math.sqrt(ss / nn) : Double.NaN;
    }

    private static boolean plausible(StarProfile p, Candidate c, int r, MeasureSettings s) {
        if (!p.converged() || !(p.amplitude() > 0)) {
            return false;
        }
        double maxShift = Math.max(2.0, s.detectionFwhm());
        if (Math.abs(p.x() - c.x()) > maxShift || Math.abs(p.y() - c.y()) > maxShift) {
            return false;
        }
        return p.fwhmMajor() < 2 * r && Double.isFinite(p.fwhmMinor());
    }

    private static StarProfile shift(StarProfile p, int dx, int dy, double background) {
        return new StarProfile(p.shape(), p.x() + dx, p.y() + dy, p.amplitude(), p.background() + background,
                p.fwhmMajor(), p.fwhmMinor(), p.angle(), p.beta(), p.flux(), p.errors(), p.fit());
    }

    // ---------------------------------------------------------------- detection

    private static List<Candidate> detect(float[] resid, int w, int h, BackgroundMap bg, MeasureSettings s) {
        double sigma = s.detectionFwhm() / (2 * Math.sqrt(2 * Math.log(2)));
        int kr = Math.max(1, (int) Math.ceil(3 * sigma));
        float[] k = new float[2 * kr + 1];
        double ks = 0;
        for (int i = -kr; i <= kr; i++) {
            ks += Math.exp(-0.5 * i * i / (sigma * sigma));
        }
        double k2 = 0;
        for (int i = -kr; i <= kr; i++) {
            double v = Math.exp(-0.5 * i * i / (sigma * sigma)) / ks;
            k[i + kr] = (float) v;
            k2 += v * v;
        }
        final double noiseGain = k2;
        int threads = s.threads();
        float[] tmp = new float[resid.length];
        float[] filt = new float[resid.length];
        Parallel.forEach(h, threads, (y, worker) -> {
            int row = y * w;
            boolean clean = true;
            for (int x = 0; x < w; x++) {
                float v = resid[row + x];
                clean &= v == v;
            }
            for (int x = 0; x < w; x++) {
                float acc = 0;
                if (clean && x >= kr && x + kr < w) {
                    // A row without masked pixels, away from its ends: the same sum in the same order,
                    // without the per-tap checks.
                    int base = row + x - kr;
                    for (int t = 0; t <= 2 * kr; t++) {
                        acc += k[t] * resid[base + t];
                    }
                    tmp[row + x] = acc;
                    continue;
                }
                int a = Math.max(0, x - kr);
                int b = Math.min(w - 1, x + kr);
                for (int xx = a; xx <= b; xx++) {
                    float v = resid[row + xx];
                    if (v == v) {
                        acc += k[xx - x + kr] * v;
                    }
                }
                tmp[row + x] = acc;
            }
        });
        float[][] rowAcc = new float[threads][w];
        Parallel.forEach(h, threads, (y, worker) -> {
            int a = Math.max(0, y - kr);
            int b = Math.min(h - 1, y + kr);
            // Row by row so that memory is read in order (a column walk would miss the cache on wide frames).
            float[] acc = rowAcc[worker];
            java.util.Arrays.fill(acc, 0f);
            for (int yy = a; yy <= b; yy++) {
                float kv = k[yy - y + kr];
                int src = yy * w;
                for (int x = 0; x < w; x++) {
                    acc[x] += kv * tmp[src + x];
                }
            }
            System.arraycopy(acc, 0, filt, y * w, w);
        });
        double minNoise = Double.POSITIVE_INFINITY;
        for (int y = 0; y < h; y += Math.max(1, bg.meshSize() / 2)) {
            for (int x = 0; x < w; x += Math.max(1, bg.meshSize() / 2)) {
                minNoise = Math.min(minNoise, bg.noiseAt(x, y));
            }
        }
        final float quick = (float) (s.thresholdSigma() * noiseGain * Math.min(minNoise, bg.globalNoise()) * 0.5);
        final int sep = s.minSeparation();
        @SuppressWarnings("unchecked")
        List<Candidate>[] rows = new List[h];
        Parallel.forEach(h, threads, (y, worker) -> {
            int row = y * w;
            List<Candidate> found = null;
            for (int x = 0; x < w; x++) {
                float v = filt[row + x];
                if (!(v > quick) || resid[row + x] != resid[row + x]) {
                    continue;
                }
                if (!(v > s.thresholdSigma() * noiseGain * bg.noiseAt(x, y))) {
                    continue;
                }
                if (!isLocalMax(filt, w, h, x, y, sep)) {
                    continue;
                }
                if (found == null) {
                    found = new ArrayList<>();
                }
                found.add(new Candidate(x, y, v, row + x, v / (noiseGain * bg.noiseAt(x, y)),
                        x + vertex(filt, row + x, 1, x > 0, x < w - 1),
                        y + vertex(filt, row + x, w, y > 0, y < h - 1)));
            }
            rows[y] = found;
        });
        List<Candidate> all = new ArrayList<>();
        for (List<Candidate> r : rows) {
            if (r != null) {
                all.addAll(r);
            }
        }
        addSecondaryPeaks(all, resid, filt, tmp, w, h, kr, noiseGain, quick, bg, s);
        all.sort((p, q) -> p.filtered() != q.filtered() ? Float.compare(q.filtered(), p.filtered())
                : Integer.compare(p.index(), q.index()));
        return all;
    }

    /**
     * Second look for close companions, which the unit-sum Gaussian blurs into a shoulder of their brighter
     * neighbour (no local maximum of their own). The lowered Gaussian — the same kernel minus its mean over the
     * (2r+1)² box, so that it sums to zero — answers a constant or a slowly varying pedestal, such as the wing
     * of a neighbour, with zero and so keeps a shoulder as a peak (Stetson 1987, PASP 99, 191, §III, the
     * detection kernel of DAOPHOT's star finder; photutils 1.6 DAOStarFinder uses the same kernel). Its
     * correlation is {@code filt − boxmean(resid)}, because the unit-sum kernel's correlation is {@code filt};
     * its white-noise gain is {@code √(Σg² − 1/N)} with N = (2r+1)².
     *
     * <p>A pixel becomes an extra candidate if the lowered correlation exceeds {@code k·σ·gain}, the unit-sum
     * correlation also exceeds the ordinary threshold, it is the largest lowered value within
     * {@code minSeparation} pixels, and no ordinary candidate lies within {@code minSeparation} pixels (those are
     * already found). Its brightness for ordering and the blend test is the ordinary filtered value, as for every
     * candidate; its sub-pixel position is the vertex of the lowered profile, where the shoulder peaks.
     *
     * @param all     ordinary candidates, brightest first (output, extra candidates appended, order restored)
     * @param resid   background-subtracted pixels (input, not modified)
     * @param filt    unit-sum Gaussian correlation (input, not modified)
     * @param scratch a work buffer of w·h values (output, overwritten)
     */
    private static void addSecondaryPeaks(List<Candidate> all, float[] resid, float[] filt, float[] scratch, int w,
                                          int h, int kr, double noiseGain, float quick, BackgroundMap bg,
                                          MeasureSettings s) {
        final int n = (2 * kr + 1) * (2 * kr + 1);
        final double lowGain = Math.sqrt(Math.max(0, noiseGain * noiseGain - 1.0 / n));
        final int threads = s.threads();
        final int sep = s.minSeparation();
        // Horizontal box sums of the residual (masked pixels count as 0, as in the ordinary correlation).
        Parallel.forEach(h, threads, (y, worker) -> {
            int row = y * w;
            double acc = 0;
            for (int x = 0; x <= Math.min(w - 1, kr - 1); x++) {
                float v = resid[row + x];
                acc += v == v ? v : 0;
            }
            for (int x = 0; x < w; x++) {
                int in = x + kr;
                if (in < w) {
                    float v = resid[row + in];
                    acc += v == v ? v : 0;
                }
                int out = x - kr - 1;
                if (out >= 0) {
                    float v = resid[row + out];
                    acc -= v == v ? v : 0;
                }
                scratch[row + x] = (float) acc;
            }
        });
        // The lowered value is needed only where the ordinary correlation passes the quick threshold and within
        // minSeparation of such pixels; it is computed on demand from the vertical sums of the box rows.
        java.util.Set<Integer> primary = new java.util.HashSet<>();
        for (Candidate c : all) {
            primary.add(c.index());
        }
        @SuppressWarnings("unchecked")
        List<Candidate>[] rows = new List[h];
        Parallel.forEach(h, threads, (y, worker) -> {
            int row = y * w;
            List<Candidate> found = null;
            for (int x = 0; x < w; x++) {
                float v = filt[row + x];
                if (!(v > quick) || resid[row + x] != resid[row + x]) {
                    continue;
                }
                double noise = bg.noiseAt(x, y);
                if (!(v > s.thresholdSigma() * noiseGain * noise)) {
                    continue;
                }
                double lv = lowered(filt, scratch, w, h, kr, n, x, y);
                if (!(lv > s.thresholdSigma() * lowGain * noise)) {
                    continue;
                }
                // The four neighbours first: nearly every pixel fails here, before the full box is scanned.
                double xm = x > 0 ? lowered(filt, scratch, w, h, kr, n, x - 1, y) : Double.NaN;
                if (xm > lv) {
                    continue;
                }
                double xp = x < w - 1 ? lowered(filt, scratch, w, h, kr, n, x + 1, y) : Double.NaN;
                if (xp > lv) {
                    continue;
                }
                double ym = y > 0 ? lowered(filt, scratch, w, h, kr, n, x, y - 1) : Double.NaN;
                if (ym > lv) {
                    continue;
                }
                double yp = y < h - 1 ? lowered(filt, scratch, w, h, kr, n, x, y + 1) : Double.NaN;
                if (yp > lv) {
                    continue;
                }
                if (nearPrimary(primary, w, h, x, y, sep) || !isLoweredMax(filt, scratch, w, h, kr, n, x, y, sep, lv)) {
                    continue;
                }
                if (found == null) {
                    found = new ArrayList<>();
                }
                found.add(new Candidate(x, y, v, row + x, v / (noiseGain * noise),
                        x + vertex3(xm, lv, xp), y + vertex3(ym, lv, yp)));
            }
            rows[y] = found;
        });
        boolean added = false;
        for (List<Candidate> r : rows) {
            if (r != null) {
                all.addAll(r);
                added = true;
            }
        }
        if (added) {
            all.sort((p, q) -> p.filtered() != q.filtered() ? Float.compare(q.filtered(), p.filtered())
                    : Integer.compare(p.index(), q.index()));
        }
    }

    /** Lowered-Gaussian correlation at (x, y): the unit-sum correlation minus the box mean of the residual. */
    private static double lowered(float[] filt, float[] rowSums, int w, int h, int kr, int n, int x, int y) {
        double box = 0;
        for (int yy = Math.max(0, y - kr); yy <= Math.min(h - 1, y + kr); yy++) {
            box += rowSums[yy * w + x];
        }
        return filt[y * w + x] - box / n;
    }

    /** True if the lowered value v at (x, y) is the largest within the separation box; ties go first in memory. */
    private static boolean isLoweredMax(float[] filt, float[] rowSums, int w, int h, int kr, int n, int x, int y,
                                        int r, double v) {
        int idx = y * w + x;
        for (int yy = Math.max(0, y - r); yy <= Math.min(h - 1, y + r); yy++) {
            for (int xx = Math.max(0, x - r); xx <= Math.min(w - 1, x + r); xx++) {
                int j = yy * w + xx;
                if (j == idx) {
                    continue;
                }
                double u = lowered(filt, rowSums, w, h, kr, n, xx, yy);
                if (u > v || (u == v && j < idx)) {
                    return false;
                }
            }
        }
        return true;
    }

    /** True if an ordinary candidate lies within Chebyshev distance r of (x, y). */
    private static boolean nearPrimary(java.util.Set<Integer> primary, int w, int h, int x, int y, int r) {
        for (int yy = Math.max(0, y - r); yy <= Math.min(h - 1, y + r); yy++) {
            for (int xx = Math.max(0, x - r); xx <= Math.min(w - 1, x + r); xx++) {
                if (primary.contains(yy * w + xx)) {
                    return true;
                }
            }
        }
        return false;
    }

    /** Vertex offset of the parabola through three values (common practice, no source), within ±0.5; 0 if none. */
    private static double vertex3(double a, double b, double c) {
        if (a != a || c != c) {
            return 0;
        }
        double den = a - 2 * b + c;
        if (!(den < 0)) {
            return 0;
        }
        return Math.max(-0.5, Math.min(0.5, 0.5 * (a - c) / den));
    }

    /**
     * Sub-pixel offset of a maximum along one axis: the vertex of the parabola through the three filtered values
     * (common practice, no source), limited to ±0.5 px; 0 at the image edge.
     */
    private static double vertex(float[] f, int i, int step, boolean hasLow, boolean hasHigh) {
        if (!hasLow || !hasHigh) {
            return 0;
        }
        double a = f[i - step];
        double b = f[i];
        double c = f[i + step];
        double den = a - 2 * b + c;
        if (!(den < 0)) {
            return 0;
        }
        return Math.max(-0.5, Math.min(0.5, 0.5 * (a - c) / den));
    }

    /** True if (x, y) is the largest within the separation box; equal values go to the first in memory. */
    private static boolean isLocalMax(float[] f, int w, int h, int x, int y, int r) {
        int idx = y * w + x;
        float v = f[idx];
        for (int yy = Math.max(0, y - r); yy <= Math.min(h - 1, y + r); yy++) {
            for (int xx = Math.max(0, x - r); xx <= Math.min(w - 1, x + r); xx++) {
                int j = yy * w + xx;
                float u = f[j];
                if (u > v || (u == v && j < idx)) {
                    return false;
                }
            }
        }
        return true;
    }

    /** Buckets of candidates for neighbour queries. */
    private static final class CandidateGrid {
        private final int cell;
        private final int cols;
        private final int rows;
        private final List<List<Candidate>> buckets;

        CandidateGrid(List<Candidate> cands, int w, int h, int cell) {
            this.cell = cell;
            this.cols = (w + cell - 1) / cell;
            this.rows = (h + cell - 1) / cell;
            this.buckets = new ArrayList<>(cols * rows);
            for (int i = 0; i < cols * rows; i++) {
                buckets.add(null);
            }
            for (Candidate c : cands) {
                int b = (c.y() / cell) * cols + c.x() / cell;
                if (buckets.get(b) == null) {
                    buckets.set(b, new ArrayList<>(2));
                }
                buckets.get(b).add(c);
            }
        }

        /** True if another candidate within Chebyshev distance r is at least fraction × as bright. */
        boolean hasBrightNeighbour(Candidate c, int r, double fraction) {
            int bx = c.x() / cell;
            int by = c.y() / cell;
            for (int j = Math.max(0, by - 1); j <= Math.min(rows - 1, by + 1); j++) {
                for (int i = Math.max(0, bx - 1); i <= Math.min(cols - 1, bx + 1); i++) {
                    List<Candidate> l = buckets.get(j * cols + i);
                    if (l == null) {
                        continue;
                    }
                    for (Candidate o : l) {
                        if (o != c && Math.abs(o.x() - c.x()) <= r && Math.abs(o.y() - c.y()) <= r
                                && o.filtered() >= fraction * c.filtered()) {
                            return true;
                        }
                    }
                }
            }
            return false;
        }
    }

    private static RejectReason cheapReject(Candidate c, float[] raw, float[] resid, int w, int h,
                                            CandidateGrid grid, MeasureSettings s, float frameMax) {
        int r = s.stampRadius();
        int x = c.x();
        int y = c.y();
        if (x - r < 0 || y - r < 0 || x + r >= w || y + r >= h) {
            return RejectReason.EDGE;
        }
        float max = Float.NEGATIVE_INFINITY;
        int px = x;
        int py = y;
        for (int yy = y - CORE; yy <= y + CORE; yy++) {
            for (int xx = x - CORE; xx <= x + CORE; xx++) {
                float v = raw[yy * w + xx];
                if (v != v) {
                    return RejectReason.MASKED;
                }
                if (v > max) {
                    max = v;
                    px = xx;
                    py = yy;
                }
            }
        }
        if (!Double.isNaN(s.saturation()) && max >= s.saturation()) {
            return RejectReason.SATURATED;
        }
        int equal = 0;
        for (int yy = y - CORE; yy <= y + CORE; yy++) {
            for (int xx = x - CORE; xx <= x + CORE; xx++) {
                if (raw[yy * w + xx] == max) {
                    equal++;
                }
            }
        }
        if (equal >= FLAT_TOP_PIXELS && max >= FLAT_TOP_FRACTION * frameMax) {
            return RejectReason.SATURATED;
        }
        if (grid.hasBrightNeighbour(c, r, s.blendFraction())) {
            return RejectReason.BLEND;
        }
        float peak = resid[py * w + px];
        double nb = 0.25 * ((double) resid[py * w + px - 1] + resid[py * w + px + 1] + resid[(py - 1) * w + px]
                + resid[(py + 1) * w + px]);
        if (peak > 0 && 1 - nb / peak > s.maxSharpness()) {
            return RejectReason.TOO_SHARP;
        }
        return null;
    }

    // ---------------------------------------------------------------- aggregation

    /** Upper bound of a summary ellipticity, so that the derived minor axis stays positive. */
    static final double MAX_SUMMARY_ELLIPTICITY = 0.95;

    /**
     * The median shape of a set of profiles. The shape is aggregated through the signed components
     * e1 = e cos 2θ, e2 = e sin 2θ: noise scatters them symmetrically about the true shape, while the median
     * of e = |(e1, e2)| is biased upwards by it (a round PSF measured on faint stars read e ≈ 0.1).
     * Component averaging is common practice in shape measurement (e.g. weak-lensing ellipticities; from
     * memory, no single source). Major and minor follow from the median FWHM = √(major·minor) and
     * minor/major = 1 − e. Every median is weighted by {@link #weights} (1/σ² of each star's FWHM).
     */
    record MedianShape(double fwhm, double major, double minor, double ellipticity, double angle) {
        static MedianShape of(List<StarProfile> ps, double[] w) {
            int n = ps.size();
            if (n == 0) {
                return new MedianShape(Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN);
            }
            double[] fw = new double[n];
            double[] e1 = new double[n];
            double[] e2 = new double[n];
            double[] an = new double[n];
            for (int i = 0; i < n; i++) {
                StarProfile p = ps.get(i);
                fw[i] = p.fwhm();
                an[i] = p.angle();
                e1[i] = p.ellipticity() * Math.cos(2 * p.angle());
                e2[i] = p.ellipticity() * Math.sin(2 * p.angle());
            }
            double m1 = Select.weightedMedian(e1, w);
            double m2 = Select.weightedMedian(e2, w);
            double ell = Math.min(MAX_SUMMARY_ELLIPTICITY, Math.hypot(m1, m2));
            double half = 0.5 * Math.atan2(m2, m1);
            double angle = ell > 0 ? (half < 0 ? half + Math.PI : half) : axialMedian(an, w);
            double fwhm = Select.weightedMedian(fw, w);
            return new MedianShape(fwhm, fwhm / Math.sqrt(1 - ell), fwhm * Math.sqrt(1 - ell), ell, angle);
        }
    }

    private static ProfileSummary summarise(ProfileShape shape, List<MeasuredStar> stars, BackgroundMap bg) {
        List<StarProfile> ps = new ArrayList<>();
        double bicG = 0;
        double bicM = 0;
        for (MeasuredStar m : stars) {
            StarProfile p = m.profile(shape);
            if (p != null) {
                ps.add(p);
            }
            if (m.moffat() != null) {
                double sig = bg.noiseAt(m.x(), m.y());
                double var = sig * sig;
                int nG = m.gaussian().fit().dof() + m.gaussian().fit().params().length;
                bicG += m.gaussian().fit().chi2() / var + 7 * Math.log(nG);
                bicM += m.moffat().fit().chi2() / var + 8 * Math.log(nG);
            }
        }
        double bic = shape == ProfileShape.GAUSSIAN ? bicG : bicM;
        if (ps.isEmpty()) {
            return new ProfileSummary(shape, 0, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN,
                    Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.POSITIVE_INFINITY);
        }
        double[] fw = ps.stream().mapToDouble(StarProfile::fwhm).toArray();
        double[] el = ps.stream().mapToDouble(StarProfile::ellipticity).toArray();
        double[] be = ps.stream().mapToDouble(StarProfile::beta).toArray();
        double[] w = weights(ps);
        boolean moffat = shape == ProfileShape.MOFFAT;
        MedianShape ms = MedianShape.of(ps, w);
        return new ProfileSummary(shape, ps.size(), ms.fwhm(), Select.madSigma(fw), ms.major(), ms.minor(),
                ms.ellipticity(), Select.madSigma(el), ms.angle(), moffat ? Select.weightedMedian(be, w) : Double.NaN,
                moffat ? Select.madSigma(be) : Double.NaN, bic);
    }

    /**
     * Each star's weight in the summaries: 1/σ² of its FWHM from the fit, so that faint stars, whose widths
     * scatter and are biased by noise, count for little (stars without a finite error get the smallest weight
     * of the others).
     */
    static double[] weights(List<StarProfile> ps) {
        double[] w = new double[ps.size()];
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < w.length; i++) {
            double e = ps.get(i).errors().fwhm();
            w[i] = e > 0 && Double.isFinite(e) ? 1 / (e * e) : Double.NaN;
            if (w[i] == w[i]) {
                min = Math.min(min, w[i]);
            }
        }
        for (int i = 0; i < w.length; i++) {
            if (w[i] != w[i]) {
                w[i] = Double.isFinite(min) ? min : 1;
            }
        }
        return w;
    }

    /** Weighted median of axial angles (period π) around their weighted doubled-angle mean direction, in [0, π). */
    static double axialMedian(double[] angles, double[] w) {
        if (angles.length == 0) {
            return Double.NaN;
        }
        double sx = 0;
        double sy = 0;
        for (int i = 0; i < angles.length; i++) {
            sx += w[i] * Math.cos(2 * angles[i]);
            sy += w[i] * Math.sin(2 * angles[i]);
        }
        double mean = 0.5 * Math.atan2(sy, sx);
        double[] d = new double[angles.length];
        for (int i = 0; i < d.length; i++) {
            d[i] = mean + Math.IEEEremainder(angles[i] - mean, Math.PI);
        }
        double m = Select.weightedMedian(d, w) % Math.PI;
        return m < 0 ? m + Math.PI : m;
    }

    private static List<RegionSummary> regions(List<MeasuredStar> stars, ProfileShape best, int w, int h,
                                               int gc, int gr) {
        List<RegionSummary> out = new ArrayList<>();
        for (int row = 0; row < gr; row++) {
            for (int col = 0; col < gc; col++) {
                int idx = row * gc + col;
                List<StarProfile> ps = new ArrayList<>();
                for (MeasuredStar m : stars) {
                    if (m.region() == idx) {
                        ps.add(m.profile(best) != null ? m.profile(best) : m.gaussian());
                    }
                }
                int x0 = (int) ((long) col * w / gc);
                int x1 = (int) ((long) (col + 1) * w / gc);
                int y0 = (int) ((long) row * h / gr);
                int y1 = (int) ((long) (row + 1) * h / gr);
                MedianShape ms = MedianShape.of(ps, weights(ps));
                out.add(new RegionSummary(col, row, x0, y0, x1, y1, ps.size(), ms.fwhm(), ms.major(), ms.minor(),
                        ms.ellipticity(), ms.angle()));
            }
        }
        return out;
    }
}
