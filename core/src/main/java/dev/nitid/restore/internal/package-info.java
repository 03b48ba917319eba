/**
 * Kernels behind {@link dev.nitid.restore}: the Richardson–Lucy iteration plan, the frequency-domain
 * filters, mask and noise estimation, and the star floor. Not part of the public API.
 */
package dev.nitid.restore.internal;
