package dev.galebench.sequence;

import java.nio.file.Path;
import java.util.List;

/**
 * A parsed and validated sequence file. Immutable; the checks are kept as factories so the
 * same sequence can be run more than once. See {@code test-sequences/README.md} for the file
 * format.
 *
 * @param name       short name, lower case with dashes (used for the run folder)
 * @param purpose    what the sequence shows, one paragraph
 * @param source     the file as the user named it ({@code library:NAME} for the library)
 * @param baseDir    directory relative paths are resolved against (null for library files)
 * @param turbine    turbine file path, or {@code default}
 * @param controller controller file path, or {@code default}
 * @param initial    operating point the run starts settled in
 * @param stepUs     plant step, us
 * @param exchangeEvery plant steps per exchange with the board
 * @param watchdogUs time without a valid reply after which the link watchdog blocks the
 *                   converters and trips the plant, us
 * @param durationS  run length, s of plant time
 * @param allowedTrips plant trips that are part of the test (do not abort the run), e.g.
 *                   {@code link_watchdog}
 * @param actions    the timeline, sorted by time
 * @param checks     the checks, in file order
 */
public record Sequence(String name, String purpose, String source, Path baseDir, String turbine, String controller,
                       Initial initial, double stepUs, int exchangeEvery, double watchdogUs, double durationS, List<String> allowedTrips,
                       List<Action> actions, List<CheckDef> checks) {

    /**
     * The settled operating point at t = 0.
     *
     * @param windMPerS         hub wind speed, m/s
     * @param gridVoltagePu     grid source voltage, pu
     * @param reactivePowerPu   reactive power at the terminal, pu of rated power
     *                          (positive = capacitive)
     */
    public record Initial(double windMPerS, double gridVoltagePu, double reactivePowerPu) {
    }

    /** Trip names a sequence may allow, with the plant's trip bits. */
    public static final List<String> TRIP_NAMES = List.of("dc_overvoltage", "msc_overcurrent", "gsc_overcurrent",
            "link_watchdog", "overspeed");

    /** Bit mask of {@link #allowedTrips} ({@code SensorView.TRIP_*}). */
    public int allowedTripMask() {
        int m = 0;
        for (String t : allowedTrips) {
            m |= 1 << (8 + TRIP_NAMES.indexOf(t));
        }
        return m;
    }

    /** Plant step, ns. */
    public long stepPeriodNs() {
        return Math.round(stepUs * 1000.0);
    }
}
