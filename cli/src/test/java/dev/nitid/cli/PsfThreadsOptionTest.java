package dev.nitid.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.nitid.psf.ConvolvedPsf;
import dev.nitid.psf.PsfModel;
import dev.nitid.psf.PupilPsf;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import picocli.CommandLine;

/** {@code --threads} reaches the pupil model that {@code psf}, {@code sharpen} and {@code simulate} build. */
class PsfThreadsOptionTest {
    private static PsfOptions parsed(String command, String field, String... args) throws Exception {
        CommandLine cl = NitidCommand.commandLine();
        String[] all = new String[args.length + 1];
        all[0] = command;
        System.arraycopy(args, 0, all, 1, args.length);
        cl.parseArgs(all);
        Object cmd = cl.getSubcommands().get(command).getCommand();
        java.lang.reflect.Field f = cmd.getClass().getDeclaredField(field);
        f.setAccessible(true);
        return (PsfOptions) f.get(cmd);
    }

    @ParameterizedTest
    @ValueSource(strings = {"psf:psf", "sharpen:model", "simulate:psfOptions"})
    void threadsOptionReachesThePupil(String commandAndField) throws Exception {
        String[] cf = commandAndField.split(":");
        String[] extra = cf[0].equals("sharpen") ? new String[] {"in.fits"} : new String[] {"-o", "out.fits"};
        String[] optics = {"--model", "airy", "--aperture", "200", "--focal-length", "1000", "--pixel-size", "3.76",
            "--threads", "1"};
        String[] args = new String[extra.length + optics.length];
        System.arraycopy(extra, 0, args, 0, extra.length);
        System.arraycopy(optics, 0, args, extra.length, optics.length);
        PsfModel m = parsed(cf[0], cf[1], args).toModel();
        assertEquals(1, ((PupilPsf) m).threads());
        String[] withSeeing = java.util.Arrays.copyOf(args, args.length + 2);
        withSeeing[args.length] = "--seeing";
        withSeeing[args.length + 1] = "2";
        withSeeing[args.length - 1] = "2";
        PsfModel s = parsed(cf[0], cf[1], withSeeing).toModel();
        assertEquals(2, ((PupilPsf) ((ConvolvedPsf) s).base()).threads());
        assertEquals(2, ((ConvolvedPsf) s).threads(), "the seeing convolution too");
    }
}
