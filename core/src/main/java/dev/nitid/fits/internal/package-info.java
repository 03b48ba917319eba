/**
 * Low-level FITS structure walking and safe file publication used by {@code dev.nitid.fits}; not API.
 */
package dev.nitid.fits.internal;
