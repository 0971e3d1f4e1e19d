package dev.galebench.cli.preflight;

import dev.galebench.rt.LoopResult;
import dev.galebench.rt.SpinFloor;

import java.util.ArrayList;
import java.util.List;

/**
 * Whether a step is sustainable on this machine, judged as ratios to the busy-spin floor
 * measured in the same run (absolute microseconds do not repeat on a shared VM):
 * <ol>
 *   <li>loop overruns (exchanges late by more than one step) &le; floor stalls (floor ticks late
 *       by more than one step, same rule): the loop adds no missed deadlines of its own;</li>
 *   <li>loop lateness p99.9 &le; {@value #LATENESS_RATIO} x floor lateness p99.9, where the
 *       floor value is taken as at least {@value #RESOLUTION_NS} ns: below a microsecond a
 *       ratio measures cache misses, not the machine;</li>
 *   <li>the run was not aborted, and at least one reply came back.</li>
 * </ol>
 * With an I/O floor (the same spin plus one loopback datagram exchange per tick with a bare
 * echo, see {@code SpinFloor.FloorIo}) the reasons also compare the loop with it, for
 * information: what the I/O floor already shows is the machine's price of exchanging with a
 * peer on another core, not the loop's. The verdict itself stays the rules above.
 */
public record PreflightVerdict(boolean sustainable, List<String> reasons) {
    public static final double LATENESS_RATIO = 1.5;
    public static final long RESOLUTION_NS = 1_000;

    public static PreflightVerdict judge(SpinFloor.Result floor, LoopResult loop) {
        return judge(floor.stalls(), floor.latenessNs().getValueAtPercentile(99.9), loop.overruns,
                loop.latenessNs.getValueAtPercentile(99.9),
                loop.aborted() ? loop.stopReason + " " + loop.stopDetail : null, loop.repliesApplied);
    }

    /** Same, with the I/O floor's comparison added to the reasons (null: none measured). */
    public static PreflightVerdict judge(SpinFloor.Result floor, LoopResult loop, SpinFloor.Result ioFloor) {
        final PreflightVerdict v = judge(floor, loop);
        if (ioFloor == null) {
            return v;
        }
        final List<String> why = new ArrayList<>(v.reasons());
        why.add(ioFloorComparison(ioFloor.stalls(), ioFloor.latenessNs().getValueAtPercentile(99.9), floor.stalls(),
                loop.overruns, loop.latenessNs.getValueAtPercentile(99.9)));
        return new PreflightVerdict(v.sustainable(), List.copyOf(why));
    }

    /** The informational line comparing the loop with the I/O floor. */
    static String ioFloorComparison(long ioStalls, long ioP999Ns, long floorStalls, long loopOverruns, long loopP999Ns) {
        return String.format(java.util.Locale.ROOT, "for reference, the I/O floor (same spin, one datagram a tick to a bare "
                        + "echo, no plant): %d stalls (%s the floor's), p99.9 %.2f us; loop overruns %s its stalls, "
                        + "loop p99.9 %s its p99.9", ioStalls, ratio(ioStalls, floorStalls), ioP999Ns / 1e3,
                ratio(loopOverruns, ioStalls), ratio(loopP999Ns, Math.max(RESOLUTION_NS, ioP999Ns)));
    }

    private static String ratio(long a, long b) {
        return b <= 0 ? (a <= 0 ? "1.00 x" : "above") : String.format(java.util.Locale.ROOT, "%.2f x", (double) a / b);
    }

    /**
     * The rules on plain numbers.
     *
     * @param stoppedEarly null if the loop ran its full duration, else why it stopped
     */
    public static PreflightVerdict judge(long floorStalls, long floorP999Ns, long loopOverruns, long loopP999Ns,
                                         String stoppedEarly, long repliesApplied) {
        List<String> why = new ArrayList<>();
        boolean ok = true;
        if (loopOverruns > floorStalls) {
            ok = false;
            why.add("loop overruns " + loopOverruns + " > floor stalls " + floorStalls);
        } else {
            why.add("loop overruns " + loopOverruns + " <= floor stalls " + floorStalls);
        }
        final long floorRef = Math.max(RESOLUTION_NS, floorP999Ns);
        final double limit = LATENESS_RATIO * floorRef;
        final String cmp = String.format(java.util.Locale.ROOT, "loop lateness p99.9 %.2f us %s %.1f x floor p99.9 %.2f us%s",
                loopP999Ns / 1e3, loopP999Ns > limit ? ">" : "<=", LATENESS_RATIO, floorP999Ns / 1e3,
                floorP999Ns < RESOLUTION_NS ? " (taken as 1 us)" : "");
        if (loopP999Ns > limit) {
            ok = false;
        }
        why.add(cmp);
        if (stoppedEarly != null) {
            ok = false;
            why.add("loop run stopped early: " + stoppedEarly);
        }
        if (repliesApplied == 0) {
            ok = false;
            why.add("the board never answered");
        }
        return new PreflightVerdict(ok, List.copyOf(why));
    }
}
