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
 */
public record PreflightVerdict(boolean sustainable, List<String> reasons) {
    public static final double LATENESS_RATIO = 1.5;
    public static final long RESOLUTION_NS = 1_000;

    public static PreflightVerdict judge(SpinFloor.Result floor, LoopResult loop) {
        List<String> why = new ArrayList<>();
        boolean ok = true;
        if (loop.overruns > floor.stalls()) {
            ok = false;
            why.add("loop overruns " + loop.overruns + " > floor stalls " + floor.stalls());
        } else {
            why.add("loop overruns " + loop.overruns + " <= floor stalls " + floor.stalls());
        }
        final long floorP999 = Math.max(RESOLUTION_NS, floor.latenessNs().getValueAtPercentile(99.9));
        final long loopP999 = loop.latenessNs.getValueAtPercentile(99.9);
        final double limit = LATENESS_RATIO * floorP999;
        if (loopP999 > limit) {
            ok = false;
            why.add(String.format("loop lateness p99.9 %.1f us > %.1f x floor %.1f us", loopP999 / 1e3, LATENESS_RATIO, floorP999 / 1e3));
        } else {
            why.add(String.format("loop lateness p99.9 %.1f us <= %.1f x floor %.1f us", loopP999 / 1e3, LATENESS_RATIO, floorP999 / 1e3));
        }
        if (loop.aborted()) {
            ok = false;
            why.add("loop run stopped early: " + loop.stopReason + " " + loop.stopDetail);
        }
        if (loop.linkCounters.repliesAccepted == 0) {
            ok = false;
            why.add("the board never answered");
        }
        return new PreflightVerdict(ok, List.copyOf(why));
    }
}
