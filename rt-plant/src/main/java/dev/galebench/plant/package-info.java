/**
 * The turbine plant: a fixed-step, allocation-free model of a full-converter wind turbine
 * (rotor aerodynamics, pitch, drivetrain, PMSG, averaged converters, DC link and chopper, grid
 * connection, measurement front end, hardware protection) and what it needs around it: the
 * turbine file and its validation ({@link dev.galebench.plant.TurbineFile}), settled
 * operating points ({@link dev.galebench.plant.SteadyState}), per-unit bases and the Cp
 * surface.
 *
 * <p>Why this shape: the real-time thread only calls {@link dev.galebench.plant.PlantModel}
 * methods on primitive state, so a plant step costs about 0.3 us and allocates nothing;
 * everything that allocates or throws (file loading, validation, steady-state solving) runs
 * before a run. The contract types ({@code PlantModel}, {@code SensorView},
 * {@code BoardCommand}, {@code TurbineParameters}) are shared with the other modules.
 * Equations, conventions and validation numbers: {@code rt-plant/README.md}.
 */
package dev.galebench.plant;
