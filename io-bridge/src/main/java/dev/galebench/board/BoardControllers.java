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
        return "hold, reference";
    }

    /** A new controller called {@code name}; IllegalArgumentException naming the choices if unknown. */
    public static BoardController create(String name) {
        if ("hold".equals(name)) {
            return new HoldController();
        }
        if ("reference".equals(name)) {
            return dev.galebench.board.control.ReferenceController.withDefaults();
        }
        throw new IllegalArgumentException("unknown board controller '" + name + "' (known: " + names() + ")");
    }
}
