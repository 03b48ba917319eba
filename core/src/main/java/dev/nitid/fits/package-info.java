/**
 * FITS and TIFF input and output: the only package that touches nom-tam-fits.
 *
 * <p>{@link dev.nitid.fits.FitsReader} validates a file's structure (SIMPLE and END present, legal BITPIX,
 * non-negative axes, declared data within the file, memory within the heap) before it allocates anything,
 * then decodes the chosen HDU into a float32 {@link dev.nitid.image.Image} with BZERO/BSCALE applied and
 * BLANK turned into NaN. {@link dev.nitid.fits.FitsWriter} writes float32 (or, on request, integer) files
 * with the caller's header cards, a fresh DATE and CHECKSUM/DATASUM, through a temporary file that is
 * forced to disk and then published without clobbering anything. {@link dev.nitid.fits.TiffIo} exchanges
 * float32 and 16-bit TIFF through the JDK's own ImageIO plugin.
 *
 * <p>Rules used throughout, from the FITS Standard 4.0 (IAU FITS Working Group, 2018), also in Pence et al.
 * 2010, A&amp;A 524, A42 (FITS 3.0): 2880-byte blocks; 80-character ASCII cards; NAXIS1 varies fastest; the
 * physical value is {@code BZERO + BSCALE × stored}; BLANK only for integer data; unsigned 16-bit is stored
 * as BITPIX 16 with BZERO 32768.
 *
 * <p>Row order: image row {@code y = 0} is the first row stored in the FITS data unit (FITS pixel row 1),
 * which viewers draw at the bottom. TIFF stores its top row first, so TIFF row {@code r} is image row
 * {@code height − 1 − r}, in both directions.
 *
 * <p>Every problem with a file is a checked {@link dev.nitid.fits.FitsException} naming the file, the HDU
 * (0 = primary) and the keyword; caller mistakes are {@link IllegalArgumentException}s.
 */
package dev.nitid.fits;
