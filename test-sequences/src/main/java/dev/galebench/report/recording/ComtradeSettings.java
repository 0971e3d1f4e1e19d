package dev.galebench.report.recording;

import java.time.Instant;
import java.util.List;

/**
 * What a {@link ComtradeRecorder} writes besides the samples.
 *
 * <table>
 *   <caption>Settings</caption>
 *   <tr><th>component</th><th>unit</th><th>meaning</th></tr>
 *   <tr><td>stationName</td><td>-</td><td>.cfg station_name (no commas), e.g. {@code GALEBENCH}</td></tr>
 *   <tr><td>deviceId</td><td>-</td><td>.cfg rec_dev_id (no commas), e.g. the sequence name</td></tr>
 *   <tr><td>revisionYear</td><td>-</td><td>1999 or 2013: which revision of C37.111 the .cfg follows</td></tr>
 *   <tr><td>lineFrequencyHz</td><td>Hz</td><td>nominal grid frequency (.cfg lf)</td></tr>
 *   <tr><td>plantTimeZero</td><td>UTC instant</td><td>wall-clock time of plant time 0; the .cfg first-sample and trigger stamps are this plus plant time</td></tr>
 *   <tr><td>triggerPlantTimeNs</td><td>ns</td><td>plant time of the trigger stamp (e.g. the first sequence action); negative = the first sample</td></tr>
 *   <tr><td>timeMultiplier</td><td>1</td><td>.cfg timemult: .dat stamps count units of timeMultiplier microseconds. With 1, a uint32 stamp covers 71.6 minutes</td></tr>
 *   <tr><td>ranges</td><td>-</td><td>expected range of every analog signal</td></tr>
 *   <tr><td>digitalChannels</td><td>-</td><td>status bits to record as digital channels; their source signals are not recorded as analog channels</td></tr>
 *   <tr><td>flushIntervalNs</td><td>ns (wall clock)</td><td>the .dat is flushed and the .cfg rewritten when at least this long has passed since the last time; 1 s or less</td></tr>
 * </table>
 */
public record ComtradeSettings(String stationName, String deviceId, int revisionYear, double lineFrequencyHz,
                               Instant plantTimeZero, long triggerPlantTimeNs, double timeMultiplier,
                               RangeSource ranges, List<DigitalChannel> digitalChannels, long flushIntervalNs) {
    /** One second, the longest flush interval allowed. */
    public static final long MAX_FLUSH_INTERVAL_NS = 1_000_000_000L;

    public ComtradeSettings {
        requireNoComma("station name", stationName);
        requireNoComma("device id", deviceId);
        if (revisionYear != 1999 && revisionYear != 2013) {
            throw new IllegalArgumentException("COMTRADE revision year must be 1999 or 2013, got " + revisionYear);
        }
        if (!(lineFrequencyHz > 0.0)) {
            throw new IllegalArgumentException("line frequency must be > 0 Hz, got " + lineFrequencyHz);
        }
        if (!(timeMultiplier > 0.0)) {
            throw new IllegalArgumentException("time multiplier must be > 0, got " + timeMultiplier);
        }
        if (flushIntervalNs <= 0 || flushIntervalNs > MAX_FLUSH_INTERVAL_NS) {
            throw new IllegalArgumentException("flush interval must be in (0, 1 s], got " + flushIntervalNs + " ns");
        }
        digitalChannels = List.copyOf(digitalChannels);
    }

    /** Revision 2013, UTC now, trigger at the first sample, stamps in microseconds, flush every second, default status bits. */
    public static ComtradeSettings defaults(String deviceId, double lineFrequencyHz, RangeSource ranges) {
        return new ComtradeSettings("GALEBENCH", deviceId.replace(',', '_'), 2013, lineFrequencyHz, Instant.now(), -1L, 1.0,
                ranges, SignalRanges.digitalChannels(), MAX_FLUSH_INTERVAL_NS);
    }

    private static void requireNoComma(String what, String s) {
        if (s == null || s.indexOf(',') >= 0 || s.indexOf('\n') >= 0 || s.indexOf('\r') >= 0) {
            throw new IllegalArgumentException(what + " must be given and may not contain commas or line breaks: '" + s + "'");
        }
    }
}
