package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.internal.SafeOutput;
import dev.nitid.image.Image;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Safe publication (common practice, no source: write a temporary file in the same folder, fsync, rename;
 * POSIX rename(2) and link(2) semantics): existing outputs are refused unless overwriting is allowed,
 * inputs are never written whatever path names them, and a failure leaves no file behind.
 */
class SafeOutputTest {
    @TempDir
    Path dir;

    private Path input;
    private byte[] inputBytes;
    private final Image image = Image.create(4, 3);

    @BeforeEach
    void writeInput() throws Exception {
        image.fill(2.5f);
        input = dir.resolve("in.fits");
        FitsWriter.write(input, image, FitsHeader.empty(), WriteOptions.defaults());
        inputBytes = Files.readAllBytes(input);
    }

    private List<Path> listing() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.sorted().toList();
        }
    }

    private FitsException refused(Path out, WriteOptions o) {
        return assertThrows(FitsException.class, () -> FitsWriter.write(out, image, FitsHeader.empty(), o));
    }

    @Test
    void existingOutputIsRefusedUnlessOverwriteAllowed() throws Exception {
        Path out = dir.resolve("out.fits");
        Files.writeString(out, "precious");
        FitsException e = refused(out, WriteOptions.defaults());
        assertEquals(FitsException.Kind.OUTPUT_EXISTS, e.kind());
        assertEquals("precious", Files.readString(out));
        FitsWriter.write(out, image, FitsHeader.empty(), WriteOptions.defaults().withOverwrite(true));
        assertEquals(2.5f, FitsReader.read(out).image().get(1, 1));
        assertEquals(List.of(input, out), listing(), "no temporary file left");
    }

    @Test
    void inputIsNeverWrittenWhateverPathNamesIt() throws Exception {
        Files.createDirectory(dir.resolve("sub"));
        Path symlink = Files.createSymbolicLink(dir.resolve("link.fits"), input);
        Path hardlink = Files.createLink(dir.resolve("hard.fits"), input);
        List<Path> names = List.of(input, dir.resolve("sub/../in.fits"), dir.resolve("./in.fits"), symlink,
                hardlink, dir.resolve("sub/../link.fits"));
        for (Path out : names) {
            FitsException e = refused(out, WriteOptions.defaults().withOverwrite(true).withProtectedInputs(input));
            assertEquals(FitsException.Kind.CANNOT_CREATE, e.kind(), out + ": " + e.getMessage());
            assertArrayEquals(inputBytes, Files.readAllBytes(input), "input changed through " + out);
        }
        // The protection also holds when the protected path is the link and the output the real name.
        FitsException e = refused(input, WriteOptions.defaults().withOverwrite(true).withProtectedInputs(symlink));
        assertEquals(FitsException.Kind.CANNOT_CREATE, e.kind());
    }

    @Test
    void missingFolderIsReported() {
        FitsException e = refused(dir.resolve("no/such/folder/out.fits"), WriteOptions.defaults());
        assertEquals(FitsException.Kind.CANNOT_CREATE, e.kind());
        assertTrue(e.getMessage().contains("does not exist"), e.getMessage());
    }

    @Test
    void failureWhileWritingLeavesNoFile() throws Exception {
        List<Path> before = listing();
        Path out = dir.resolve("out.fits");
        FitsException e = assertThrows(FitsException.class, () -> SafeOutput.write(out, false, List.of(), ch -> {
            ch.write(java.nio.ByteBuffer.wrap(new byte[1000]));
            throw new IOException("No space left on device (simulated)");
        }));
        assertEquals(FitsException.Kind.WRITE_FAILED, e.kind());
        assertTrue(e.getMessage().contains("No space left"), e.getMessage());
        assertEquals(before, listing(), "a partial or temporary file was left behind");
    }

    @Test
    void overwritingASymlinkReplacesTheLinkNotItsTarget() throws Exception {
        Path other = dir.resolve("other.txt");
        Files.writeString(other, "unrelated");
        Path link = Files.createSymbolicLink(dir.resolve("out.fits"), other);
        FitsWriter.write(link, image, FitsHeader.empty(), WriteOptions.defaults().withOverwrite(true));
        assertEquals("unrelated", Files.readString(other));
        assertTrue(!Files.isSymbolicLink(link) && Files.size(link) % 2880 == 0);
    }

    @Test
    void outputThatIsAFolderIsRefused() throws Exception {
        Path sub = Files.createDirectory(dir.resolve("folder.fits"));
        FitsException e = refused(sub, WriteOptions.defaults().withOverwrite(true));
        assertEquals(FitsException.Kind.CANNOT_CREATE, e.kind());
    }
}
