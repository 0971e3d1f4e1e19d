package dev.galebench.sequence;

import java.util.List;

/**
 * Timeline rules, checked before any run: every action ends within the run, and actions on
 * the same track do not overlap (an instantaneous change may coincide with the end of a ramp,
 * but not with another change). Tracks: wind, wind shape (gust, turbulence, added on top of the
 * wind), grid voltage, grid phase, grid frequency, grid strength, voltage reference, link.
 */
final class Timeline {
    private static final double EPS_S = 1e-9;

    private Timeline() {
    }

    static String track(Action a) {
        if (a instanceof Action.WindStep || a instanceof Action.WindRamp) {
            return "wind";
        }
        if (a instanceof Action.WindGust || a instanceof Action.Turbulence) {
            return "wind shape";
        }
        if (a instanceof Action.GridVoltageEvent) {
            return "grid voltage";
        }
        if (a instanceof Action.PhaseJump) {
            return "grid phase";
        }
        if (a instanceof Action.FrequencyStep || a instanceof Action.FrequencyRamp) {
            return "grid frequency";
        }
        if (a instanceof Action.GridStrength) {
            return "grid strength";
        }
        if (a instanceof Action.VoltageRefStep) {
            return "voltage reference";
        }
        return "link";
    }

    /**
     * Validates {@code actions} (sorted by time) and returns each action's extent in s. A
     * frequency ramp's extent depends on the frequency before it; with {@code initialHz} NaN and
     * no earlier frequency step it is unknown (NaN) and judged again when the schedule is compiled.
     */
    static double[] validate(List<Action> actions, double durationS, double initialHz) {
        final int n = actions.size();
        double[] extent = new double[n];
        double hz = initialHz;
        for (int i = 0; i < n; i++) {
            Action a = actions.get(i);
            if (a instanceof Action.FrequencyRamp) {
                Action.FrequencyRamp r = (Action.FrequencyRamp) a;
                if (Double.isNaN(hz)) {
                    extent[i] = Double.NaN;
                } else {
                    if (hz == r.toHz()) {
                        throw new SequenceException(a.mark(), "frequency_ramp to " + YamlObject.fmt(r.toHz())
                                + " Hz: the frequency is already " + YamlObject.fmt(hz) + " Hz");
                    }
                    extent[i] = Math.abs(r.toHz() - hz) / r.rateHzPerS();
                }
                hz = r.toHz();
            } else {
                if (a instanceof Action.FrequencyStep) {
                    hz = ((Action.FrequencyStep) a).toHz();
                }
                extent[i] = a.extentS();
            }
            if (a.atS() + extent[i] > durationS + EPS_S) {
                throw new SequenceException(a.mark(), a.kind() + " at " + YamlObject.fmt(a.atS()) + " s acts until "
                        + YamlObject.fmt(a.atS() + extent[i]) + " s, after the end of the run ("
                        + YamlObject.fmt(durationS) + " s)");
            }
        }
        for (int j = 1; j < n; j++) {
            Action b = actions.get(j);
            for (int i = 0; i < j; i++) {
                Action a = actions.get(i);
                if (!track(a).equals(track(b))) {
                    continue;
                }
                double endA = a.atS() + (Double.isNaN(extent[i]) ? 0 : extent[i]);
                boolean clash = b.atS() < endA - EPS_S || Math.abs(b.atS() - a.atS()) <= EPS_S;
                if (clash) {
                    throw new SequenceException(b.mark(), b.kind() + " at " + YamlObject.fmt(b.atS()) + " s overlaps "
                            + a.kind() + " at " + YamlObject.fmt(a.atS()) + " s (line " + a.mark().line()
                            + ", acting until " + YamlObject.fmt(endA) + " s) on the " + track(a) + " track");
                }
            }
        }
        return extent;
    }
}
