package dev.galebench.report;

import dev.galebench.report.recording.ComtradeRecorder;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * What the COMTRADE recorder counted during a run, for the reports: out-of-range samples it
 * clamped and NaN samples it wrote as missing (per channel, only channels with a count above
 * zero), gaps in the sample stream, saturated stamps, samples lost to an I/O error. Shown as a
 * notice in report.html and as {@code recording} in summary.json, so a clipped waveform is never
 * mistaken for a real plateau.
 *
 * @param records            records in the .dat
 * @param clampedSamples     channel -&gt; samples clamped to the channel's range
 * @param missingSamples     channel -&gt; NaN samples written as the missing code
 * @param gaps               times the exchange index jumped (samples missed by the recorder)
 * @param stampOverflows     samples whose 32-bit stamp saturated
 * @param unrecordedSamples  samples received but not written (after an I/O error)
 * @param failure            the I/O error that stopped the recording, or null
 */
public record RecordingStats(long records, Map<String, Long> clampedSamples, Map<String, Long> missingSamples, long gaps,
                             long stampOverflows, long unrecordedSamples, String failure) {
    public RecordingStats {
        clampedSamples = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(clampedSamples));
        missingSamples = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(missingSamples));
    }

    /** Reads the counters of a recorder after {@code onEnd}. */
    public static RecordingStats of(ComtradeRecorder r) {
        Map<String, Long> clamped = new LinkedHashMap<>();
        Map<String, Long> missing = new LinkedHashMap<>();
        List<String> names = r.analogChannelNames();
        for (int k = 0; k < names.size(); k++) {
            if (r.clampedSampleCount(k) > 0) {
                clamped.put(names.get(k), r.clampedSampleCount(k));
            }
            if (r.missingSampleCount(k) > 0) {
                missing.put(names.get(k), r.missingSampleCount(k));
            }
        }
        return new RecordingStats(r.recordCount(), clamped, missing, r.gapCount(), r.stampOverflowCount(),
                r.unrecordedSampleCount(), r.failure() == null ? null : r.failure().toString());
    }

    /** Sum of clamped samples over all channels. */
    public long totalClamped() {
        return clampedSamples.values().stream().mapToLong(Long::longValue).sum();
    }
}
