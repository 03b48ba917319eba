/**
 * Kernels of star measurement (profile models, background mesh, matched filter). Not exported.
 */
package dev.nitid.stars.internal;
