/**
 * Streaming writers of a run's samples, each a {@link dev.galebench.rt.SampleConsumer} on its
 * own ring-consumer thread: the COMTRADE recorder (binary, fixed per-channel scaling chosen
 * before the run, flushed at least every second so a killed run stays readable) and the CSV
 * recorder. Nothing here may run on the real-time thread: they format text and write files.
 */
package dev.galebench.report.recording;
