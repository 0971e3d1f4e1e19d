package dev.galebench.report.recording;

/** Gives the expected range of an analog signal; {@link SignalRanges} is the default, tests pass their own. */
@FunctionalInterface
public interface RangeSource {
    /** The range of signal {@code name} whose unit is {@code unit}; never null. */
    SignalRange rangeOf(String name, String unit);
}
