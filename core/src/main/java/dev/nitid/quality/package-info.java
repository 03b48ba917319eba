/**
 * Restoration quality metrics: how much a restorer sharpened stars, how deep the dark rings it dug are, how
 * close it came to the truth between stars, whether it kept star fluxes and how much it amplified the sky
 * noise. Each metric's definition is in the Javadoc of its method in {@link dev.nitid.quality.QualityMetrics}.
 */
package dev.nitid.quality;
