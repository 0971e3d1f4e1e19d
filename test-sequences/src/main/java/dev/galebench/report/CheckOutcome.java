package dev.galebench.report;

/**
 * The verdict of one check of a sequence, as every report writes it.
 *
 * @param name        check name from the sequence file (unique within a sequence)
 * @param kind        check kind (e.g. {@code band}, {@code settle}, {@code rise_time})
 * @param passed      true if the requirement was met
 * @param measured    what was measured, human-readable with unit (e.g. {@code "12.4 ms"})
 * @param required    what was required, human-readable with unit (e.g. {@code "<= 30 ms"})
 * @param message     one sentence a reviewer reads when it failed (or a note when it passed)
 * @param signal      the main signal the check judged (for plots), or null
 * @param windowStartS start of the judged window, s of plant time (NaN if none)
 * @param windowEndS  end of the judged window, s (NaN if none)
 * @param bandLow     lower limit drawn on the plot, in the signal's unit (NaN if none)
 * @param bandHigh    upper limit drawn on the plot (NaN if none)
 */
public record CheckOutcome(String name, String kind, boolean passed, String measured, String required,
                           String message, String signal, double windowStartS, double windowEndS,
                           double bandLow, double bandHigh) {
}
