/**
 * Nitid's library: PSF-based restoration of astronomical images, PSF models and measurement, FITS input
 * and output, synthetic fields. Only the role packages are exported; the {@code ...internal} packages
 * (kernels, plans, scanners) are not part of the API and stay encapsulated.
 */
module dev.nitid.core {
    // BufferedImage appears in the API (PsfPreview, FieldMap, TiffIo), so readers of this module read it too.
    requires transitive java.desktop;
    // Automatic modules, named from the jar file (JTransforms 3.2 and nom-tam-fits 1.21.2 carry no
    // Automatic-Module-Name) or from EJML's jar names; none of their types appear in the exported API.
    requires JTransforms;
    requires nom.tam.fits;
    requires ejml.core;
    requires ejml.ddense;

    exports dev.nitid.image;
    exports dev.nitid.fft;
    exports dev.nitid.psf;
    exports dev.nitid.restore;
    exports dev.nitid.stars;
    exports dev.nitid.stars.fit;
    exports dev.nitid.fits;
    exports dev.nitid.synth;
    exports dev.nitid.quality;
}
