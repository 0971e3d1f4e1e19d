package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * Bits of a flags signal (e.g. {@code trip_flags}) that must never be set over a window: "no
 * trip other than the link watchdog" is {@code never_set} = all trip bits except bit 11.
 */
public final class FlagsCheck extends SingleSignalCheck {
    private final long mask;
    private final double fromS, toS;
    private long count;
    private double firstS = Double.NaN;
    private long firstBits;
    private long seenBits;

    public FlagsCheck(String name, String signal, long mask, double fromS, double toS) {
        super(name, "flags", signal);
        this.mask = mask;
        this.fromS = fromS;
        this.toS = toS;
    }



    @Override
    public void onSample(double timeS, double[] values) {
        if (timeS < fromS || timeS > toS) {
            return;
        }
        count++;
        final long bits = (long) values[slot];
        seenBits |= bits;
        if ((bits & mask) != 0 && Double.isNaN(firstS)) {
            firstS = timeS;
            firstBits = bits & mask;
        }
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        String required = "bits 0x" + Long.toHexString(mask) + " of " + signal + " never set from " + Fmt.time(fromS)
                + " to " + Fmt.time(toS);
        if (count == 0) {
            return outcome(false, "no samples", required, "no sample of " + signal + " in the window", signal, fromS,
                    toS, Double.NaN, Double.NaN);
        }
        String measured = "bits seen 0x" + Long.toHexString(seenBits);
        if (Double.isNaN(firstS)) {
            return outcome(true, measured, required, "none of the forbidden bits was set", signal, fromS, toS,
                    Double.NaN, Double.NaN);
        }
        return outcome(false, measured, required, signal + " set forbidden bits 0x" + Long.toHexString(firstBits)
                + " at " + Fmt.time(firstS), signal, fromS, toS, Double.NaN, Double.NaN);
    }
}
