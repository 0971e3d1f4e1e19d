package dev.galebench.runner;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.SampleLayout;
import dev.galebench.sequence.SequenceLibrary;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

/**
 * The k-factor check of the library judges reactive current in pu of I_N, the converter's rated
 * current, while the plant's {@code i_reactive_pu} is in pu of the rated-power current. The
 * factor written in the library file must match the turbine and the plant's base: if either
 * changes, this test says so instead of the k-factor verdict silently shifting by 10 %.
 */
class CurrentBaseTest {

    @Test
    void shouldMatchTheLibraryRatedCurrentFactorToTurbineAndPlant() {
        TurbineParameters p = TurbineFile.defaults();
        TurbinePlant plant = new TurbinePlant(p, 50_000);
        plant.initialise(SteadyState.solve(p, 10.0, 1.0, 0.3));
        double[] v = new double[plant.signalCount()];
        plant.sample(v);
        SampleLayout l = SampleLayout.of(plant);
        double iq = v[l.indexOf("i_reactive_pu")], u = v[l.indexOf("v_term_pu")], q = v[l.indexOf("q_grid_pu")];
        // q = u * i_q when both are in pu of rated power (positive-sequence, balanced)
        assertEquals(q, u * iq, 1e-3, "i_reactive_pu is in pu of the rated-power current");
        double ratedPowerCurrentRmsA = p.ratedPowerW / (Math.sqrt(3.0) * p.lvVoltageV);
        double factor = p.converterRatedCurrentA / ratedPowerCurrentRmsA;
        Matcher m = Pattern.compile("rated_current_pu: ([0-9.]+)").matcher(SequenceLibrary.text("dip-3ph-50pct"));
        m.find();
        assertEquals(factor, Double.parseDouble(m.group(1)), 1e-4);
    }
}
