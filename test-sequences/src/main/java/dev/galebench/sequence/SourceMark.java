package dev.galebench.sequence;

/**
 * Where something was written in a sequence file: 1-based line and column, as an editor
 * shows them. Kept on every parsed action and check so that errors found later (an unknown
 * signal when the run's layout is known, an overlap found while compiling the schedule) still
 * point at the line that caused them.
 *
 * @param file   the file as the user named it (path or {@code library:NAME})
 * @param line   1-based line
 * @param column 1-based column
 */
public record SourceMark(String file, int line, int column) {
    @Override
    public String toString() {
        return file + ":" + line + ":" + column;
    }
}
