/**
 * Order statistics shared by every package: exact selection and medians over float and double arrays
 * (quickselect), weighted medians and MAD. Not exported.
 */
package dev.nitid.image.internal;
