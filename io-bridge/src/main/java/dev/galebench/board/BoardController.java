package dev.galebench.board;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;

/**
 * The control law a board runs: at every exchange it reads the sensor view and writes the
 * command. The virtual board (separate process, over UDP or serial) and the in-process link
 * (offline runs) both drive a {@code BoardController}, so the same controller answers in both.
 *
 * <p>{@link #update} runs once per exchange on the caller's thread; in-process it runs on the
 * real-time thread, so it must allocate nothing, lock nothing and never throw for control flow.
 */
public interface BoardController {
    /** Control period: time between two calls of {@link #update}, seconds. Set before the first update. */
    void setSamplePeriod(double samplePeriodS);

    /**
     * Called once with the first measurement, before the first {@link #update}: a controller
     * initialises its filters, PLL and integrators from it so a settled plant stays settled.
     */
    void start(SensorView first);

    /** One control period: read {@code in}, write every field of {@code out} except {@code answeredSequence}. */
    void update(SensorView in, BoardCommand out);
}
