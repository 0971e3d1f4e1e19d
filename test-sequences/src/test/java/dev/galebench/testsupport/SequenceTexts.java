package dev.galebench.testsupport;

/** Small sequence files for parser tests, built from a valid skeleton. */
public final class SequenceTexts {
    private SequenceTexts() {
    }

    /** A valid file with the given actions block and checks block (YAML, indented by two). */
    public static String with(String actions, String checks) {
        return "format: 1\n"
                + "name: test-seq\n"
                + "purpose: A test.\n"
                + "initial:\n"
                + "  wind_m_s: 10.0\n"
                + "duration_s: 3.0\n"
                + "actions:\n" + actions
                + "checks:\n" + checks;
    }

    public static final String NO_TRIP = "  - name: no-trip\n    band: {signal: trip_flags, high: 0}\n";
}
