package dev.galebench.sequence;

import dev.galebench.check.StreamingCheck;
import java.util.Map;
import java.util.function.Supplier;

/**
 * A check as written in a sequence file: its name, kind and position, the signals it reads
 * (each with the position where it was written, for "unknown signal" errors) and a factory that
 * builds a fresh streaming check for each run.
 */
public record CheckDef(String name, String kind, SourceMark mark, Map<String, SourceMark> signals,
                       Supplier<StreamingCheck> factory) {
}
