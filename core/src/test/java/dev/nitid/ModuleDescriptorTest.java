package dev.nitid;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.io.InputStream;
import java.lang.module.ModuleDescriptor;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Set;
import java.util.TreeSet;
import java.util.stream.Collectors;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * The compiled {@code module-info.class} of core exports exactly the role packages, without qualification,
 * and no {@code ...internal} package; every other package of core is an internal one. Module declarations:
 * The Java Language Specification, Java SE 17, §7.7; read with {@link ModuleDescriptor#read(InputStream)}.
 */
class ModuleDescriptorTest {
    /** The role packages (STYLE.md "Packages by role"; DEVELOPERS.md package table). */
    static final Set<String> ROLE_PACKAGES = Set.of("dev.nitid.image", "dev.nitid.fft", "dev.nitid.psf",
            "dev.nitid.restore", "dev.nitid.stars", "dev.nitid.stars.fit", "dev.nitid.fits", "dev.nitid.synth",
            "dev.nitid.quality");

    /** core's compiled classes (target/classes when run by Maven), found from a class of core. */
    private static Path classesRoot() throws Exception {
        return Path.of(Image.class.getProtectionDomain().getCodeSource().getLocation().toURI());
    }

    private static ModuleDescriptor descriptor() throws Exception {
        try (InputStream in = Files.newInputStream(classesRoot().resolve("module-info.class"))) {
            return ModuleDescriptor.read(in);
        }
    }

    @Test
    void exportsExactlyTheRolePackages() throws Exception {
        ModuleDescriptor d = descriptor();
        assertEquals("dev.nitid.core", d.name(), "the name the jar carried as Automatic-Module-Name before");
        Set<String> exported = new TreeSet<>();
        for (ModuleDescriptor.Exports e : d.exports()) {
            assertFalse(e.isQualified(), e + " is a qualified export");
            exported.add(e.source());
        }
        assertEquals(new TreeSet<>(ROLE_PACKAGES), exported);
        assertTrue(d.opens().isEmpty(), "no package is opened for reflection: " + d.opens());
        assertFalse(d.isOpen(), "not an open module");
    }

    @Test
    void everyOtherPackageIsInternal() throws Exception {
        Path root = classesRoot();
        Set<String> packages;
        try (Stream<Path> files = Files.walk(root)) {
            packages = files.filter(p -> p.toString().endsWith(".class") && !p.getFileName().toString()
                            .equals("module-info.class"))
                    .map(p -> root.relativize(p.getParent()).toString().replace(java.io.File.separatorChar, '.'))
                    .collect(Collectors.toCollection(TreeSet::new));
        }
        assertTrue(packages.containsAll(ROLE_PACKAGES), "every role package is compiled: " + packages);
        for (String p : packages) {
            assertTrue(ROLE_PACKAGES.contains(p) || p.endsWith(".internal"),
                    p + " is neither a role package nor an internal one: export it or move it under internal");
        }
    }

    @Test
    void requiresOnlyWhatTheLibraryUses() throws Exception {
        Set<String> requires = descriptor().requires().stream().map(ModuleDescriptor.Requires::name)
                .collect(Collectors.toCollection(TreeSet::new));
        // JTransforms 3.2, nom-tam-fits 1.21.2 and EJML 0.46.1 have no module descriptor and no
        // Automatic-Module-Name: their names come from the jar file names (java.lang.module.ModuleFinder#of)
        assertEquals(new TreeSet<>(Set.of("java.base", "java.desktop", "JTransforms", "nom.tam.fits", "ejml.core",
                "ejml.ddense")), requires);
    }

}
