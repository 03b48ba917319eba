package dev.nitid.restore;

/** Factories of {@link Restorer}s, named by intent. */
public final class Restorers {
    private Restorers() {
    }

    /**
     * A restorer for the given settings.
     *
     * @param settings what to run
     * @return the restorer
     */
    public static Restorer create(RestoreSettings settings) {
        if (settings == null) {
            throw new IllegalArgumentException("settings is null: use RestoreSettings.defaults()");
        }
        return new PlanningRestorer(settings);
    }

    /**
     * The safe default: use this if you are not sure what you need ({@link RestoreSettings#defaults()}).
     *
     * @return the restorer
     */
    public static Restorer general() {
        return create(RestoreSettings.defaults());
    }
}
