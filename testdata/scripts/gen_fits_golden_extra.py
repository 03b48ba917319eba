#!/usr/bin/env python3
"""More FITS golden files written by astropy, for the flavours the first set lacks.

Run from the repository root:  /usr/bin/python3 testdata/scripts/gen_fits_golden_extra.py
Needs numpy and astropy (Debian python3-astropy). Writes, beside the first golden set,
testdata/src/main/resources/dev/nitid/testdata/reference/golden/:
  fits_ext_image.fits       empty primary HDU + IMAGE extension 'SCI' (int32, BSCALE 0.5, BZERO 10)
                            + a second IMAGE extension 'ERR' (float32)
  fits_u16_gzip.fits.gz     the uint16-through-BZERO image of fits_u16_bzero32768.fits, gzip-compressed
  fits_i8_rgb_cube.fits     3-plane (NAXIS3 = 3) uint8 cube with WCS CD matrix cards
  fits_i64.fits             int64 values beyond 2^31
  fits_extra_expected.csv   every pixel's physical value as astropy reads it, and the versions used
"""
import csv
import gzip
import io
import os
import numpy as np
import astropy
from astropy.io import fits

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "src", "main", "resources", "dev", "nitid",
                   "testdata", "reference", "golden")


def main():
    rows = []

    sci_stored = np.array([[-3, 0, 7], [100, -200, 2147483647]], dtype=np.int32)
    sci = fits.ImageHDU(sci_stored, name="SCI")
    sci.header["BSCALE"] = 0.5
    sci.header["BZERO"] = 10.0
    err = fits.ImageHDU(np.array([[0.25, 0.5, np.nan]], dtype=np.float32), name="ERR")
    fits.HDUList([fits.PrimaryHDU(), sci, err]).writeto(os.path.join(OUT, "fits_ext_image.fits"), overwrite=True)

    u16 = np.array([[0, 1, 2, 32767], [32768, 32769, 65534, 65535], [1000, 2000, 3000, 4000]], dtype=np.uint16)
    buf = io.BytesIO()
    fits.PrimaryHDU(u16).writeto(buf)
    with open(os.path.join(OUT, "fits_u16_gzip.fits.gz"), "wb") as f:
        f.write(gzip.compress(buf.getvalue(), mtime=0))

    rgb = (np.arange(3 * 4 * 5).reshape(3, 4, 5) * 4).astype(np.uint8)
    h = fits.PrimaryHDU(rgb)
    for k, v in [("CTYPE1", "RA---TAN"), ("CTYPE2", "DEC--TAN"), ("CRPIX1", 3.0), ("CRPIX2", 2.5),
                 ("CRVAL1", 83.8), ("CRVAL2", -5.4), ("CD1_1", -2.5e-4), ("CD1_2", 0.0), ("CD2_1", 0.0),
                 ("CD2_2", 2.5e-4)]:
        h.header[k] = v
    h.writeto(os.path.join(OUT, "fits_i8_rgb_cube.fits"), overwrite=True)

    i64 = np.array([[-(2 ** 40), 0, 2 ** 40 + 1]], dtype=np.int64)
    fits.PrimaryHDU(i64).writeto(os.path.join(OUT, "fits_i64.fits"), overwrite=True)

    # Read everything back with astropy to record the physical values a reader must produce.
    for name in ["fits_ext_image.fits", "fits_u16_gzip.fits.gz", "fits_i8_rgb_cube.fits", "fits_i64.fits"]:
        with fits.open(os.path.join(OUT, name)) as hl:
            for idx, hdu in enumerate(hl):
                if hdu.data is None:
                    continue
                d = np.asarray(hdu.data, dtype=np.float64)
                d3 = d.reshape((-1,) + d.shape[-2:])
                for (p, r, c), v in np.ndenumerate(d3):
                    rows.append((name, idx, p, r, c, "nan" if np.isnan(v) else repr(float(v))))

    with open(os.path.join(OUT, "fits_extra_expected.csv"), "w", newline="") as f:
        f.write(f"# written by testdata/scripts/gen_fits_golden_extra.py with astropy {astropy.__version__}, "
                f"numpy {np.__version__}; values are physical (BZERO + BSCALE x stored) as float64\n")
        w = csv.writer(f)
        w.writerow(["file", "hdu", "plane", "row", "col", "value"])
        w.writerows(rows)
    print(len(rows), "values; astropy", astropy.__version__, "numpy", np.__version__)


if __name__ == "__main__":
    main()
