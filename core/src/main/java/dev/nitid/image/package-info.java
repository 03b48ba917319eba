/**
 * The image data type: {@link dev.nitid.image.Image}, float32 planes over flat row-major arrays, and
 * {@link dev.nitid.image.ImageStats}, statistics accumulated in double.
 */
package dev.nitid.image;
