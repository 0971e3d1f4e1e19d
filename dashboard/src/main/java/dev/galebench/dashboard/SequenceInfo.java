package dev.galebench.dashboard;

/**
 * One entry of the sequence list a bench offers.
 *
 * @param name        name a user starts it by (unique on this bench)
 * @param description one line for the list, may be empty
 * @param durationS   nominal plant-time length, s ({@code NaN} if unknown)
 */
public record SequenceInfo(String name, String description, double durationS) {
}
