/**
 * Sequence files: the format (documented in {@code test-sequences/README.md}), the parser with
 * file:line:column errors ({@link dev.galebench.sequence.SequenceParser}), the timeline rules, and
 * the compiled step-indexed schedule the real-time loop runs as its
 * {@link dev.galebench.rt.StepHook} ({@link dev.galebench.sequence.Schedule}). Parsing and
 * compiling allocate freely; the schedule's {@code beforeStep} allocates nothing.
 */
package dev.galebench.sequence;
