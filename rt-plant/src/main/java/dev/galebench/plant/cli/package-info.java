/**
 * The {@code galebench turbine} commands ({@code show}, {@code steady}): registered in the
 * tool's command line, they read a turbine file and print parameters or a settled point.
 * They live next to the plant because they need nothing but the plant's own classes.
 */
package dev.galebench.plant.cli;
