#!/usr/bin/env python3
"""Writes the hostile FITS corpus: broken, truncated, absurd and odd files, each with its expected outcome.

Run from the repository root:  python3 testdata/scripts/gen_fits_hostile.py
Needs only the Python 3 standard library (the files are built byte by byte so that every defect is exact).
Writes testdata/src/main/resources/dev/nitid/testdata/hostile/*.fits* and manifest.csv.

Rules followed (and broken on purpose) are those of the FITS Standard 4.0 (IAU FITS Working Group, 2018):
2880-byte blocks, 80-character ASCII cards, SIMPLE first, END last, BITPIX in {8,16,32,64,-32,-64}.

manifest.csv columns:
  file      name in this folder
  expect    the FitsException kind the reader must throw (BAD_DATA, ...) or OK
  exit      exit code of `nitid info FILE` (65 bad data, 0 ok)
  hdu       HDU the error names (-1 if none)
  keyword   keyword the error names (empty if none)
  contains  a phrase the error message must contain (OK rows: the masked pixel count)
  what      the defect, in words
"""
import gzip
import hashlib
import io
import os
import struct

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "src", "main", "resources",
                   "dev", "nitid", "testdata", "hostile")
BLOCK = 2880


def card(key, value=None, comment=None, raw=None):
    if raw is not None:
        text = raw
    elif value is None:
        text = key.ljust(8) + ("" if comment is None else comment)
    else:
        if isinstance(value, bool):
            v = ("T" if value else "F").rjust(20)
        elif isinstance(value, str):
            v = ("'" + value.ljust(8) + "'").ljust(20)
        else:
            v = str(value).rjust(20)
        text = key.ljust(8) + "= " + v + ("" if comment is None else " / " + comment)
    assert len(text) <= 80, text
    return text.ljust(80).encode("ascii")


def header(cards, end=True):
    data = b"".join(cards) + (card("END") if end else b"")
    pad = (-len(data)) % BLOCK
    return data + b" " * pad


def data_block(raw):
    return raw + b"\0" * ((-len(raw)) % BLOCK)


def primary(bitpix, axes, extra=()):
    cs = [card("SIMPLE", True), card("BITPIX", bitpix), card("NAXIS", len(axes))]
    cs += [card("NAXIS%d" % (i + 1), n) for i, n in enumerate(axes)]
    cs += list(extra)
    return cs


def f32(values):
    return struct.pack(">%df" % len(values), *values)


def main():
    os.makedirs(OUT, exist_ok=True)
    rows = []

    def put(name, content, expect, exit_code, hdu, keyword, contains, what):
        with open(os.path.join(OUT, name), "wb") as f:
            f.write(content)
        rows.append((name, expect, exit_code, hdu, keyword, contains, what))

    good = header(primary(-32, [4, 3])) + data_block(f32([float(i) for i in range(12)]))

    put("empty.fits", b"", "BAD_DATA", 65, -1, "", "empty", "zero bytes")
    put("text.fits", b"This is a plain text note, not an image.\n" * 3, "BAD_DATA", 65, -1, "SIMPLE",
        "not a FITS file", "plain text")
    put("png_magic.fits", b"\x89PNG\r\n\x1a\n" + bytes(range(256)) * 4, "BAD_DATA", 65, -1, "SIMPLE",
        "not a FITS file", "PNG signature and binary bytes")
    put("no_end.fits", header(primary(-32, [4, 3]), end=False), "BAD_DATA", 65, 0, "",
        "without an END card", "one header block without END, then end of file")
    put("truncated_header.fits", good[:1000], "BAD_DATA", 65, 0, "", "without an END card",
        "header cut after 1000 bytes")
    put("truncated_data.fits", good[:BLOCK + 20], "BAD_DATA", 65, 0, "", "truncated",
        "data unit cut to 20 of 48 bytes")
    put("naxis0.fits", header(primary(8, [])), "BAD_DATA", 65, -1, "", "no HDU holds image data",
        "primary header only, NAXIS = 0")
    put("naxis1.fits", header(primary(-32, [12])) + data_block(f32([1.0] * 12)), "BAD_DATA", 65, 0, "NAXIS",
        "one-dimensional", "a 1-D spectrum-like array")
    put("naxis4.fits", header(primary(-32, [2, 2, 2, 2])) + data_block(f32([1.0] * 16)), "BAD_DATA", 65, 0,
        "NAXIS", "only 2-D images and cubes", "4-D data with NAXIS4 = 2")
    put("naxis3_too_many_planes.fits", header(primary(-32, [2, 2, 5])) + data_block(f32([1.0] * 20)),
        "BAD_DATA", 65, 0, "NAXIS3", "planes", "a cube of 5 planes")
    put("zero_axis.fits", header(primary(-32, [4, 0])), "BAD_DATA", 65, -1, "", "NAXIS2 = 4 x 0",
        "NAXIS2 = 0, so no pixels")
    put("naxis_1000.fits", header(primary(8, [])[:2] + [card("NAXIS", 1000)]), "BAD_DATA", 65, 0, "NAXIS",
        "outside the legal range", "NAXIS = 1000")
    put("negative_axis.fits", header(primary(-32, [4, -5])), "BAD_DATA", 65, 0, "NAXIS2", "negative",
        "NAXIS2 = -5")
    put("naxis_not_integer.fits", header([card("SIMPLE", True), card("BITPIX", -32), card("NAXIS", 2),
                                          card("NAXIS1", "10.5", raw="NAXIS1  =                 10.5"),
                                          card("NAXIS2", 2)]), "BAD_DATA", 65, 0, "NAXIS1", "not an integer",
        "NAXIS1 = 10.5")
    put("missing_naxis.fits", header([card("SIMPLE", True), card("BITPIX", 16)]), "BAD_DATA", 65, 0, "NAXIS",
        "missing", "no NAXIS card")
    put("bitpix12.fits", header(primary(12, [4, 3])) + data_block(b"\0" * 18), "BAD_DATA", 65, 0, "BITPIX",
        "not one of the legal values", "BITPIX = 12 (nom-tam-fits 1.21.2 accepts it)")
    put("bitpix_string.fits", header([card("SIMPLE", True), card("BITPIX", "abc"), card("NAXIS", 0)]),
        "BAD_DATA", 65, 0, "BITPIX", "not an integer", "BITPIX = 'abc'")
    put("simple_false.fits", header([card("SIMPLE", False)] + primary(-32, [4, 3])[1:])
        + data_block(f32([0.0] * 12)), "BAD_DATA", 65, 0, "SIMPLE", "does not conform",
        "SIMPLE = F")
    put("absurd_size_overflow.fits", header(primary(-64, [2147483647, 2147483647, 4])), "BAD_DATA", 65, 0,
        "NAXIS", "too large to exist", "declared size overflows 64 bits")
    put("absurd_size_100k.fits", header(primary(-32, [100000, 100000])), "BAD_DATA", 65, 0, "",
        "truncated", "declares 40 GB of data in a 2880-byte file")
    garbage = bytearray(header(primary(-32, [4, 3]) + [card("OBJECT", "field")]))
    garbage[4 * 80 + 12: 4 * 80 + 20] = bytes([0x00, 0xFF, 0x1B, 0x7F, 0x80, 0x01, 0xC3, 0xA9])
    put("garbage_in_header.fits", bytes(garbage) + data_block(f32([0.0] * 12)), "BAD_DATA", 65, 0, "",
        "printable ASCII", "binary bytes inside header card 5")
    put("bscale_string.fits", header(primary(16, [2, 2], [card("BSCALE", "x")])) + data_block(b"\0" * 8),
        "BAD_DATA", 65, 0, "BSCALE", "not a finite number", "BSCALE = 'x'")
    put("bintable_only.fits",
        header(primary(8, [], [card("EXTEND", True)]))
        + header([card("XTENSION", "BINTABLE"), card("BITPIX", 8), card("NAXIS", 2), card("NAXIS1", 4),
                  card("NAXIS2", 2), card("PCOUNT", 0), card("GCOUNT", 1), card("TFIELDS", 1),
                  card("TFORM1", "1E")]) + data_block(f32([1.0, 2.0])),
        "BAD_DATA", 65, -1, "", "no HDU holds image data", "an empty primary and a binary table")
    put("extension_truncated.fits",
        header(primary(8, [], [card("EXTEND", True)]))
        + header([card("XTENSION", "IMAGE"), card("BITPIX", -32), card("NAXIS", 2), card("NAXIS1", 100),
                  card("NAXIS2", 100), card("PCOUNT", 0), card("GCOUNT", 1)]) + data_block(f32([1.0] * 100)),
        "BAD_DATA", 65, 1, "", "truncated", "IMAGE extension with 400 of 40000 data bytes")
    put("gzip_damaged.fits.gz", gzip.compress(good)[:10] + bytes(range(7, 250)) * 3, "BAD_DATA", 65, -1, "",
        "gzip", "a gzip header followed by garbage")
    # Pseudo-random pixels (a fixed linear congruential sequence) so that gzip cannot shrink the data
    # unit to a few bytes and the cut lands inside it.
    lcg, noisy = 12345, []
    for _ in range(100 * 100):
        lcg = (1103515245 * lcg + 12345) % 2 ** 31
        noisy.append(lcg / 2 ** 31)
    big = header(primary(-32, [100, 100])) + data_block(f32(noisy))
    put("gzip_truncated.fits.gz", gzip.compress(big, mtime=0)[:12000], "BAD_DATA", 65, 0, "", "truncated",
        "a gzip stream cut short inside the data unit")
    put("all_nan.fits", header(primary(-32, [3, 2])) + data_block(f32([float("nan")] * 6)), "OK", 0, 0, "",
        "6", "every pixel is NaN (readable: all masked)")
    put("blank_in_float.fits", header(primary(-32, [2, 2], [card("BLANK", -999)]))
        + data_block(f32([1.0, 2.0, -999.0, 4.0])), "OK", 0, 0, "", "0",
        "BLANK in a float HDU (forbidden by FITS 4.0 §5.3; ignored, -999 stays a value)")
    put("trailing_junk.fits", good + b"this text follows the last HDU", "OK", 0, 0, "", "0",
        "valid file followed by junk bytes (ignored)")

    with open(os.path.join(OUT, "manifest.csv"), "w") as f:
        f.write("# written by testdata/scripts/gen_fits_hostile.py; sha256 lets tests check inputs are unchanged\n")
        f.write("file,expect,exit,hdu,keyword,contains,sha256,what\n")
        for name, expect, exit_code, hdu, keyword, contains, what in rows:
            sha = hashlib.sha256(open(os.path.join(OUT, name), "rb").read()).hexdigest()
            assert "," not in contains, name  # "what" is the last column and may hold commas
            f.write(f"{name},{expect},{exit_code},{hdu},{keyword},{contains},{sha},{what}\n")
    print(len(rows), "files in", os.path.normpath(OUT))


if __name__ == "__main__":
    main()
