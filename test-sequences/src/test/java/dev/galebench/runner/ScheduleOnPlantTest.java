package dev.galebench.runner;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.galebench.board.control.ReferenceController;
import dev.galebench.link.BoardLinks;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleConsumer;
import dev.galebench.rt.SampleLayout;
import dev.galebench.rt.support.CollectingConsumer;
import dev.galebench.sequence.Schedule;
import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceParser;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The compiled schedule drives the real plant in the real loop: each input changes in the
 * first sample after its action time, to the value the sequence asked for.
 */
class ScheduleOnPlantTest {

    @Test
    void shouldChangeThePlantInputsAtTheExactStep() throws Exception {
        Sequence seq = SequenceParser.parse("t.yaml", "name: exact\npurpose: Exact times.\ninitial: {wind_m_s: 9.0}\n"
                + "duration_s: 0.3\nactions:\n"
                + "  - at_s: 0.1\n    wind_step: {to_m_s: 9.5}\n"
                + "  - at_s: 0.15\n    frequency_step: {to_hz: 50.2}\n"
                + "  - at_s: 0.2\n    grid_dip: {depth_pu: 0.3, duration_s: 0.05}\n"
                + "checks:\n  - name: no-trip\n    band: {signal: trip_flags, high: 0}\n", null);
        TurbineParameters p = TurbineFile.defaults();
        long stepNs = 50_000;
        TurbinePlant plant = new TurbinePlant(p, stepNs);
        plant.initialise(SteadyState.solve(p, 9.0, 1.0, 0.0));
        ReferenceController c = new ReferenceController(p, dev.galebench.board.control.ControllerFile.defaults());
        c.setSamplePeriod(50e-6);
        Schedule schedule = Schedule.compile(seq, stepNs, new Schedule.Start(9.0, 1.0, p.gridFrequencyHz,
                p.shortCircuitRatio, p.gridXOverR), null);
        CollectingConsumer samples = new CollectingConsumer();
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(stepNs).durationSteps(schedule.totalSteps()).realTime(false)
                .ringSize(8192).build();
        new RealTimeLoop(cfg, plant, BoardLinks.inProcess(c), schedule, List.<SampleConsumer>of(samples),
                SampleLayout.of(plant)).run();
        int wind = samples.column("wind_m_s"), f = samples.column("grid_frequency_hz"), vs = samples.column("v_source_pu");
        // sample k ends at (k + 1) * 50 us; the action at t acts from step t / h, so the first
        // sample showing it is the one ending at t + h: index t / h
        assertEquals(9.0, samples.values.get(1999)[wind]);
        assertEquals(9.5, samples.values.get(2000)[wind]);
        assertEquals(50.0, samples.values.get(2999)[f]);
        assertEquals(50.2, samples.values.get(3000)[f]);
        assertEquals(1.0, samples.values.get(3999)[vs], 1e-12);
        assertEquals(0.7, samples.values.get(4000)[vs], 1e-12);
        assertEquals(0.7, samples.values.get(4999)[vs], 1e-12);
        assertEquals(1.0, samples.values.get(5000)[vs], 1e-12);
        assertEquals(6000, samples.values.size());
    }
}
