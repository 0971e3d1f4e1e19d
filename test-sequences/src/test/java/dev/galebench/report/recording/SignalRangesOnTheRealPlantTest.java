package dev.galebench.report.recording;

import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.SampleLayout;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;

/**
 * The default ranges against the project's real plant and default turbine: every signal the
 * loop records has a rule (none falls back), and the settled operating points across the wind
 * range sit inside their channel ranges with room to spare for a fault transient.
 */
class SignalRangesOnTheRealPlantTest {
    @Test
    void shouldHaveARuleForEverySignalTheLoopRecords() {
        TurbineParameters p = TurbineFile.defaults();
        TurbinePlant plant = new TurbinePlant(p, 50_000L);
        SampleLayout layout = SampleLayout.of(plant);
        SignalRanges ranges = new SignalRanges(p);
        List<String> fallback = new ArrayList<>();
        for (int i = 0; i < layout.signalCount(); i++) {
            String name = layout.name(i);
            if (!SignalRanges.isStatusSignal(name) && ranges.rangeOf(name, layout.unit(i)).source().startsWith("fallback")) {
                fallback.add(name + " [" + layout.unit(i) + "]");
            }
        }
        assertEquals(List.of(), fallback);
    }

    @Test
    void shouldHoldSettledOperatingPointsWellInsideTheRanges() {
        TurbineParameters p = TurbineFile.defaults();
        TurbinePlant plant = new TurbinePlant(p, 50_000L);
        SignalRanges ranges = new SignalRanges(p);
        double[] values = new double[plant.signalCount()];
        List<String> problems = new ArrayList<>();
        double[] winds = {p.cutInWindMPerS + 1.0, 0.5 * (p.cutInWindMPerS + p.ratedWindMPerS), p.ratedWindMPerS,
                p.cutOutWindMPerS - 1.0};
        for (double wind : winds) {
            plant.initialise(SteadyState.solve(p, wind, 1.0, 0.0));
            plant.sample(values);
            for (int i = 0; i < values.length; i++) {
                String name = plant.signalName(i);
                if (SignalRanges.isStatusSignal(name) || Double.isNaN(values[i])) {
                    continue;
                }
                SignalRange r = ranges.rangeOf(name, plant.signalUnit(i));
                // settled values use at most 80 % of the range: the rest is headroom for transients
                double mid = 0.5 * (r.maxValue() + r.minValue());
                double half = 0.5 * (r.maxValue() - r.minValue());
                if (Math.abs(values[i] - mid) > 0.8 * half + 1e-9 && !(r.minValue() == 0.0 && values[i] >= 0 && values[i] < 0.8 * r.maxValue())) {
                    problems.add(String.format("%s = %.4g at %.1f m/s, range %s..%s", name, values[i], wind, r.minValue(), r.maxValue()));
                }
            }
        }
        assertEquals(List.of(), problems);
    }
}
