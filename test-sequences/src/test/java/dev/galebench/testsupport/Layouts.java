package dev.galebench.testsupport;

import dev.galebench.check.SignalIndex;

/**
 * Signal layouts for tests: the real run layout (the default turbine plant's signals plus the
 * loop's board and timing signals), as the runner builds it.
 */
public final class Layouts {
    private static final SignalIndex REAL = real();

    private Layouts() {
    }

    private static SignalIndex real() {
        dev.galebench.rt.SampleLayout l = dev.galebench.rt.SampleLayout.of(
                new dev.galebench.plant.TurbinePlant(dev.galebench.plant.TurbineFile.defaults(), 50_000));
        return new SignalIndex(l.names(), l.units());
    }

    /** Every signal of a run with the default turbine, in slot order. */
    public static SignalIndex documented() {
        return REAL;
    }

    /** A small layout with just the given names (unit "pu" for all). */
    public static SignalIndex of(String... names) {
        String[] u = new String[names.length];
        java.util.Arrays.fill(u, "pu");
        return new SignalIndex(names, u);
    }
}
