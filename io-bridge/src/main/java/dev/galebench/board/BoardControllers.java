package dev.galebench.board;

/**
 * Controllers the virtual board can run, by name ({@code galebench board --controller NAME}).
 * Add a line here when a controller lands.
 */
public final class BoardControllers {
    private BoardControllers() {
    }

    /** Names accepted by {@link #create}. */
    public static String names() {
        return "hold";
    }

    /** A new controller called {@code name}; IllegalArgumentException naming the choices if unknown. */
    public static BoardController create(String name) {
        if ("hold".equals(name)) {
            return new HoldController();
        }
        throw new IllegalArgumentException("unknown board controller '" + name + "' (known: " + names() + ")");
    }
}
