package dev.galebench.sequence;

/**
 * A sequence file that cannot be run: bad YAML, a missing or unknown key, a value out of
 * range, an impossible or overlapping timing, an unknown signal. The message always starts
 * with {@code file:line:column:} so terminals and editors can jump to it.
 *
 * <p>It extends {@link IllegalArgumentException} because the command line maps that to exit
 * code 2 (bad input) with the message printed as is.
 */
public final class SequenceException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    private final transient SourceMark mark;
    private final String reason;

    public SequenceException(SourceMark mark, String reason) {
        super(mark + ": " + reason);
        this.mark = mark;
        this.reason = reason;
    }

    public SequenceException(SourceMark mark, String reason, Throwable cause) {
        super(mark + ": " + reason, cause);
        this.mark = mark;
        this.reason = reason;
    }

    /** Where the problem is. */
    public SourceMark mark() {
        return mark;
    }

    /** The problem, without the location prefix. */
    public String reason() {
        return reason;
    }
}
