package dev.galebench.rt;

import dev.galebench.plant.PlantModel;

/**
 * Work the real-time thread does before each plant step, e.g. a compiled sequence schedule
 * applying wind and grid actions at exact steps. Runs on the real-time thread: it must
 * allocate nothing, lock nothing, log nothing and finish in well under a microsecond.
 */
@FunctionalInterface
public interface StepHook {
    /** Called before plant step {@code stepIndex} (0-based) is taken. */
    void beforeStep(long stepIndex, PlantModel plant);
}
