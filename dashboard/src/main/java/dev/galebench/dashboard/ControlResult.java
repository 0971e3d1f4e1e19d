package dev.galebench.dashboard;

/**
 * Answer of a {@link BenchControl} call, shown to the user who asked and written to the
 * console's control log.
 *
 * @param accepted true if the bench took the request
 * @param message  one sentence: what happened, or why it was refused
 */
public record ControlResult(boolean accepted, String message) {
    /** A taken request. */
    public static ControlResult ok(String message) {
        return new ControlResult(true, message);
    }

    /** A refused request; {@code why} names the reason. */
    public static ControlResult refused(String why) {
        return new ControlResult(false, why);
    }
}
