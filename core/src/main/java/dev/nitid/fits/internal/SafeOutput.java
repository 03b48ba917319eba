package dev.nitid.fits.internal;

import dev.nitid.fits.FitsException;
import dev.nitid.fits.FitsException.Kind;
import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.AccessDeniedException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.List;
import java.util.concurrent.ThreadLocalRandom;

/**
 * Publishes an output file safely: the content goes to a temporary file in the output's own folder, is
 * forced to disk, and is then renamed into place, so that readers never see a partial file and a failure
 * leaves nothing behind. Without overwrite the final step is a hard link, which fails atomically if the
 * name appeared in the meantime, so nothing is ever clobbered (POSIX {@code link(2)}); on file systems
 * without hard links a plain rename without replacement is used.
 *
 * <p>Protected inputs are compared with the output as the same file through symbolic links, hard links and
 * {@code ..} ({@link Files#isSameFile}, plus the real path of the output's folder when it does not exist).
 */
public final class SafeOutput {
    private SafeOutput() {
    }

    /** Writes the content of a temporary file. */
    @FunctionalInterface
    public interface Content {
        /**
         * @param channel the temporary file, open for writing
         * @throws IOException on a write error
         */
        void write(FileChannel channel) throws IOException;
    }

    /**
     * Checks that {@code target} may be written at all.
     *
     * @param target          the output path
     * @param overwrite       whether an existing file may be replaced
     * @param protectedInputs files never to be written
     * @return the absolute, normalised target
     * @throws FitsException {@link Kind#CANNOT_CREATE} or {@link Kind#OUTPUT_EXISTS}
     */
    public static Path check(Path target, boolean overwrite, List<Path> protectedInputs) throws FitsException {
        Path abs = target.toAbsolutePath().normalize();
        Path dir = abs.getParent();
        if (dir == null || !Files.isDirectory(dir)) {
            throw new FitsException(Kind.CANNOT_CREATE, target, -1, null, "the output folder " + dir
                    + " does not exist (create it first or choose another output path)");
        }
        for (Path in : protectedInputs) {
            if (sameFile(abs, in)) {
                throw new FitsException(Kind.CANNOT_CREATE, target, -1, null, "the output is the input file "
                        + in + ", which is never overwritten (choose a different output name)");
            }
        }
        if (Files.isDirectory(abs)) {
            throw new FitsException(Kind.CANNOT_CREATE, target, -1, null,
                    "the output path is a folder (give a file name)");
        }
        if (!overwrite && Files.exists(abs, LinkOption.NOFOLLOW_LINKS)) {
            throw new FitsException(Kind.OUTPUT_EXISTS, target, -1, null,
                    "the output file already exists (choose another name, or allow overwriting with --overwrite)");
        }
        return abs;
    }

    /**
     * Writes and publishes the output.
     *
     * @param target          the output path
     * @param overwrite       whether an existing file may be replaced
     * @param protectedInputs files never to be written
     * @param content         writes the bytes
     * @throws FitsException if the output cannot be created, exists, or writing fails; no file is left
     */
    public static void write(Path target, boolean overwrite, List<Path> protectedInputs, Content content)
            throws FitsException {
        Path abs = check(target, overwrite, protectedInputs);
        Path dir = abs.getParent();
        Path tmp = null;
        try {
            for (int attempt = 0; tmp == null; attempt++) {
                Path candidate = dir.resolve("." + abs.getFileName() + "."
                        + Long.toHexString(ThreadLocalRandom.current().nextLong() & Long.MAX_VALUE) + ".part");
                try {
                    // CREATE_NEW: the file's permissions come from the user's umask, like any new file.
                    try (FileChannel ch = FileChannel.open(candidate, StandardOpenOption.CREATE_NEW,
                            StandardOpenOption.WRITE)) {
                        tmp = candidate;
                        content.write(ch);
                        ch.force(true);
                    }
                } catch (FileAlreadyExistsException e) {
                    if (attempt > 20) {
                        throw e;
                    }
                }
            }
            publish(tmp, abs, overwrite, target);
            tmp = null;
            syncFolder(dir);
        } catch (AccessDeniedException e) {
            throw new FitsException(Kind.CANNOT_CREATE, target, -1, null, "permission to write in "
                    + dir + " is denied (choose a folder you can write to)", e);
        } catch (NoSuchFileException e) {
            throw new FitsException(Kind.CANNOT_CREATE, target, -1, null, "the output folder " + dir
                    + " disappeared while writing (create it again and retry)", e);
        } catch (IOException e) {
            throw new FitsException(Kind.WRITE_FAILED, target, -1, null, "writing failed (" + e.getMessage()
                    + "), and no output was left behind (check free disk space and the device, then retry)", e);
        } finally {
            if (tmp != null) {
                try {
                    Files.deleteIfExists(tmp);
                } catch (IOException ignored) {
                    // Best effort: the original error matters more than a leftover temporary file.
                }
            }
        }
    }

    private static void publish(Path tmp, Path abs, boolean overwrite, Path target) throws IOException, FitsException {
        if (overwrite) {
            Files.move(tmp, abs, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            return;
        }
        try {
            Files.createLink(abs, tmp);
        } catch (FileAlreadyExistsException e) {
            throw new FitsException(Kind.OUTPUT_EXISTS, target, -1, null, "the output file appeared while "
                    + "writing (choose another name, or allow overwriting with --overwrite)", e);
        } catch (UnsupportedOperationException | IOException e) {
            if (Files.exists(abs, LinkOption.NOFOLLOW_LINKS)) {
                throw new FitsException(Kind.OUTPUT_EXISTS, target, -1, null, "the output file appeared while "
                        + "writing (choose another name, or allow overwriting with --overwrite)", e);
            }
            Files.move(tmp, abs);
            return;
        }
        Files.delete(tmp);
    }

    private static void syncFolder(Path dir) {
        // Makes the rename durable (POSIX fsync on the directory); not possible on every platform.
        try (FileChannel ch = FileChannel.open(dir, StandardOpenOption.READ)) {
            ch.force(true);
        } catch (IOException | RuntimeException ignored) {
            // The data themselves were forced before the rename; this is the best effort beyond it.
        }
    }

    /**
     * @param output an output path, absolute and normalised
     * @param input  a path that must not be written
     * @return true if both name the same file
     */
    public static boolean sameFile(Path output, Path input) {
        try {
            if (Files.exists(output) && Files.exists(input)) {
                return Files.isSameFile(output, input);
            }
            Path inReal = Files.exists(input) ? input.toRealPath() : input.toAbsolutePath().normalize();
            Path outDir = output.getParent();
            Path outReal = (outDir != null && Files.exists(outDir) ? outDir.toRealPath() : outDir)
                    .resolve(output.getFileName());
            return outReal.equals(inReal) || output.equals(input.toAbsolutePath().normalize());
        } catch (IOException e) {
            return output.equals(input.toAbsolutePath().normalize());
        }
    }
}
