package dev.galebench.dashboard;

/**
 * A check verdict as the console shows it the moment it falls. Mirrors the fields of the
 * report's check outcome that a viewer needs; the runner converts.
 *
 * @param name     check name from the sequence file
 * @param kind     check kind (e.g. {@code band}, {@code settle})
 * @param passed   true if the requirement was met
 * @param measured what was measured, with unit
 * @param required what was required, with unit
 * @param message  one sentence for a reviewer
 */
public record Verdict(String name, String kind, boolean passed, String measured, String required,
                      String message) {
}
