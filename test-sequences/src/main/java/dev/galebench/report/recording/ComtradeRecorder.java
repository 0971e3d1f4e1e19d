package dev.galebench.report.recording;

import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;

import java.io.IOException;
import java.math.BigDecimal;
import java.math.MathContext;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.time.Instant;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Streams every signal of a run into a COMTRADE recording (IEEE C37.111-1999/2013, IEC
 * 60255-24) with a BINARY {@code .dat}: 16-bit analog channels and status bits packed 16 per
 * word, so any viewer of that standard opens it.
 *
 * <p>Written while the run goes on, so a run killed half-way leaves a readable recording:
 * <ul>
 *   <li>the {@code .cfg} is written at {@link #onStart} (0 samples) and rewritten whenever the
 *       {@code .dat} is flushed, with the number of records flushed so far; it is written to a
 *       temporary file and renamed over the old one, so a reader never sees half a .cfg, and the
 *       count it holds never exceeds the records in the .dat;</li>
 *   <li>records are buffered (64 KiB) and the buffer is written when full or when
 *       {@link ComtradeSettings#flushIntervalNs()} (at most 1 s) of wall-clock time has passed,
 *       checked at every sample. Data is handed to the operating system, not forced to disk:
 *       it survives the process being killed, not a power cut.</li>
 * </ul>
 *
 * <p>Scaling: each analog channel maps its {@link SignalRange} onto codes -32767..32767
 * ({@code value = a * code + b}, a and b rounded to 9 significant digits and written in plain
 * decimal notation); values outside are clamped and counted per channel, NaN is written as
 * the missing-value code 0x8000 and counted. Signals carrying status bits are not recorded as
 * analog channels; each configured bit becomes a digital channel.
 *
 * <p>Samples are numbered 1..N in the file. If the sample stream has gaps (a consumer fell
 * behind, see {@link SampleConsumer#onEnd}), the .cfg switches to {@code nrates = 0}
 * ("time stamps are critical") so viewers place each record by its stamp, which is always the
 * plant time since the first sample.
 *
 * <p>Cost per sample: one clock read, a few multiplies per channel, no allocation; a flush is
 * one write of the buffer and a .cfg of a few kilobytes. Runs on the consumer's thread only.
 * An I/O error stops the recording; it is kept in {@link #failure()} and the samples not
 * recorded after it are counted in {@link #unrecordedSampleCount()}, never dropped silently.
 */
public final class ComtradeRecorder implements SampleConsumer {
    private static final int BUFFER_BYTES = 64 * 1024;
    private static final int CODE_LIMIT = 32767;
    private static final short MISSING_CODE = (short) 0x8000;
    private static final DateTimeFormatter STAMP = DateTimeFormatter.ofPattern("dd/MM/yyyy,HH:mm:ss.SSSSSS");

    private final Path cfgPath;
    private final Path cfgTempPath;
    private final Path datPath;
    private final ComtradeSettings settings;

    // layout, fixed at onStart
    private String[] analogNames = new String[0];
    private String[] analogUnits = new String[0];
    private int[] analogSource = new int[0];
    private double[] analogA = new double[0];
    private double[] analogB = new double[0];
    private SignalRange[] analogRanges = new SignalRange[0];
    private long[] clampedCounts = new long[0];
    private long[] missingCounts = new long[0];
    private int[] digitalSource = new int[0];
    private long[] digitalMask = new long[0];
    private List<DigitalChannel> digitals = List.of();
    private int statusWords;
    private int recordBytes;
    private double sampleRateHz;
    private double stampUnitNs;

    private FileChannel dat;
    private ByteBuffer buffer;
    private long recordCount;
    private long flushedRecordCount;
    private long firstPlantTimeNs;
    private long lastPlantTimeNs;
    private long lastExchangeIndex = -1;
    private long gapCount;
    private long stampOverflowCount;
    private long lastFlushWallNs;
    private long samplesMissed;
    private long unrecordedSamples;
    private IOException failure;
    private boolean ended;

    /**
     * @param directory run folder (must exist)
     * @param baseName  file name without extension; {@code baseName.cfg} and {@code baseName.dat} are written
     */
    public ComtradeRecorder(Path directory, String baseName, ComtradeSettings settings) {
        this.cfgPath = directory.resolve(baseName + ".cfg");
        this.cfgTempPath = directory.resolve(baseName + ".cfg.tmp");
        this.datPath = directory.resolve(baseName + ".dat");
        this.settings = settings;
    }

    @Override
    public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
        List<Integer> analog = new ArrayList<>();
        for (int i = 0; i < signalNames.length; i++) {
            if (!isDigitalSource(signalNames[i])) {
                analog.add(i);
            }
        }
        int nA = analog.size();
        analogNames = new String[nA];
        analogUnits = new String[nA];
        analogSource = new int[nA];
        analogA = new double[nA];
        analogB = new double[nA];
        analogRanges = new SignalRange[nA];
        clampedCounts = new long[nA];
        missingCounts = new long[nA];
        for (int k = 0; k < nA; k++) {
            int i = analog.get(k);
            String name = signalNames[i];
            String unit = signalUnits[i];
            if (name.indexOf(',') >= 0) {
                throw new IllegalArgumentException("signal name may not contain a comma: '" + name + "'");
            }
            SignalRange r = settings.ranges().rangeOf(name, unit);
            analogNames[k] = name;
            analogUnits[k] = unit == null ? "" : unit.replace(',', ';');
            analogSource[k] = i;
            analogRanges[k] = r;
            analogA[k] = round9((r.maxValue() - r.minValue()) / (2.0 * CODE_LIMIT));
            analogB[k] = round9((r.maxValue() + r.minValue()) / 2.0);
        }
        List<DigitalChannel> present = new ArrayList<>();
        for (DigitalChannel d : settings.digitalChannels()) {
            if (indexOf(signalNames, d.signalName()) >= 0) {
                present.add(d);
            }
        }
        digitals = List.copyOf(present);
        digitalSource = new int[digitals.size()];
        digitalMask = new long[digitals.size()];
        for (int k = 0; k < digitals.size(); k++) {
            digitalSource[k] = indexOf(signalNames, digitals.get(k).signalName());
            digitalMask[k] = digitals.get(k).bitMask();
        }
        statusWords = (digitals.size() + 15) / 16;
        recordBytes = 8 + 2 * nA + 2 * statusWords;
        long exchangePeriodNs = stepPeriodNs * exchangeEverySteps;
        sampleRateHz = 1.0e9 / exchangePeriodNs;
        stampUnitNs = 1000.0 * settings.timeMultiplier();
        buffer = ByteBuffer.allocate(Math.max(BUFFER_BYTES, recordBytes)).order(ByteOrder.LITTLE_ENDIAN);
        try {
            dat = FileChannel.open(datPath, StandardOpenOption.CREATE, StandardOpenOption.TRUNCATE_EXISTING, StandardOpenOption.WRITE);
            writeCfg();
        } catch (IOException e) {
            failure = e;
        }
        lastFlushWallNs = System.nanoTime();
    }

    @Override
    public void onSample(Sample sample) {
        if (failure != null || ended) {
            unrecordedSamples++;
            return;
        }
        final long plantTimeNs = sample.plantTimeNs;
        if (recordCount == 0) {
            firstPlantTimeNs = plantTimeNs;
        } else if (sample.exchangeIndex != lastExchangeIndex + 1) {
            gapCount++;
        }
        lastExchangeIndex = sample.exchangeIndex;
        lastPlantTimeNs = plantTimeNs;
        if (buffer.remaining() < recordBytes) {
            writeBuffer();
            if (failure != null) {
                unrecordedSamples++;
                return;
            }
        }
        final ByteBuffer b = buffer;
        final double[] values = sample.values;
        long stamp = Math.round((plantTimeNs - firstPlantTimeNs) / stampUnitNs);
        if (stamp > 0xFFFF_FFFFL) {
            stamp = 0xFFFF_FFFFL;
            stampOverflowCount++;
        }
        b.putInt((int) (recordCount + 1));
        b.putInt((int) stamp);
        final int nA = analogSource.length;
        for (int k = 0; k < nA; k++) {
            final double v = values[analogSource[k]];
            if (Double.isNaN(v)) {
                b.putShort(MISSING_CODE);
                missingCounts[k]++;
                continue;
            }
            double code = Math.rint((v - analogB[k]) / analogA[k]);
            if (code > CODE_LIMIT) {
                code = CODE_LIMIT;
                clampedCounts[k]++;
            } else if (code < -CODE_LIMIT) {
                code = -CODE_LIMIT;
                clampedCounts[k]++;
            }
            b.putShort((short) code);
        }
        final int nD = digitalSource.length;
        for (int w = 0; w < statusWords; w++) {
            int word = 0;
            final int end = Math.min(nD, (w + 1) * 16);
            for (int k = w * 16; k < end; k++) {
                final double v = values[digitalSource[k]];
                if (!Double.isNaN(v) && (((long) v) & digitalMask[k]) != 0) {
                    word |= 1 << (k - w * 16);
                }
            }
            b.putShort((short) word);
        }
        recordCount++;
        final long now = System.nanoTime();
        if (now - lastFlushWallNs >= settings.flushIntervalNs()) {
            flush();
        }
    }

    @Override
    public void onEnd(long samplesMissed) {
        if (ended) {
            return;
        }
        this.samplesMissed = samplesMissed;
        flush();
        ended = true;
        try {
            if (dat != null) {
                dat.close();
            }
        } catch (IOException e) {
            if (failure == null) {
                failure = e;
            }
        }
    }

    /** Writes buffered records to the .dat and rewrites the .cfg with the count. Consumer thread only. */
    public void flush() {
        lastFlushWallNs = System.nanoTime();
        if (failure != null || dat == null) {
            return;
        }
        writeBuffer();
        if (failure != null) {
            return;
        }
        flushedRecordCount = recordCount;
        try {
            writeCfg();
        } catch (IOException e) {
            failure = e;
        }
    }

    private void writeBuffer() {
        buffer.flip();
        try {
            while (buffer.hasRemaining()) {
                dat.write(buffer);
            }
        } catch (IOException e) {
            failure = e;
            unrecordedSamples += recordCount - flushedRecordCount;
        }
        buffer.clear();
    }

    private void writeCfg() throws IOException {
        Files.write(cfgTempPath, cfgText().getBytes(StandardCharsets.US_ASCII));
        try {
            Files.move(cfgTempPath, cfgPath, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (java.nio.file.AtomicMoveNotSupportedException e) {
            // a file system without atomic rename: a reader may, rarely, catch the .cfg half-replaced
            Files.move(cfgTempPath, cfgPath, StandardCopyOption.REPLACE_EXISTING);
        }
    }

    /** The .cfg as it would be written now (CR LF line ends). */
    String cfgText() {
        StringBuilder s = new StringBuilder(4096);
        int nA = analogNames.length;
        int nD = digitals.size();
        line(s, settings.stationName() + "," + settings.deviceId() + "," + settings.revisionYear());
        line(s, (nA + nD) + "," + nA + "A," + nD + "D");
        for (int k = 0; k < nA; k++) {
            line(s, (k + 1) + "," + analogNames[k] + "," + phaseOf(analogNames[k]) + ",," + analogUnits[k] + ","
                    + plain(analogA[k]) + "," + plain(analogB[k]) + ",0," + (-CODE_LIMIT) + "," + CODE_LIMIT + ",1,1,P");
        }
        for (int k = 0; k < nD; k++) {
            DigitalChannel d = digitals.get(k);
            line(s, (k + 1) + "," + d.channelName() + ",," + d.signalName() + "," + d.normalState());
        }
        line(s, plain(settings.lineFrequencyHz()));
        long flushed = flushedRecordCount;
        if (gapCount > 0) {
            line(s, "0");
            line(s, "0," + flushed);
        } else {
            line(s, "1");
            line(s, plain(sampleRateHz) + "," + flushed);
        }
        Instant zero = settings.plantTimeZero();
        long firstNs = flushed > 0 || recordCount > 0 ? firstPlantTimeNs : 0L;
        long triggerNs = settings.triggerPlantTimeNs() < 0 ? firstNs : settings.triggerPlantTimeNs();
        line(s, stamp(zero.plusNanos(firstNs)));
        line(s, stamp(zero.plusNanos(triggerNs)));
        line(s, "BINARY");
        line(s, plain(settings.timeMultiplier()));
        if (settings.revisionYear() == 2013) {
            line(s, "0,0");
            line(s, "F,3");
        }
        return s.toString();
    }

    private static void line(StringBuilder s, String text) {
        s.append(text).append("\r\n");
    }

    private static String stamp(Instant t) {
        return LocalDateTime.ofInstant(t, ZoneOffset.UTC).format(STAMP);
    }

    /** Phase letter for the .cfg ph field: the token before the unit suffix when it is a, b or c. */
    private static String phaseOf(String name) {
        String[] parts = name.split("_");
        if (parts.length >= 3) {
            String p = parts[parts.length - 2];
            if (p.equals("a") || p.equals("b") || p.equals("c")) {
                return p.toUpperCase();
            }
        }
        return "";
    }

    static double round9(double v) {
        return new BigDecimal(v).round(new MathContext(9)).doubleValue();
    }

    static String plain(double v) {
        BigDecimal d = new BigDecimal(Double.toString(v)).stripTrailingZeros();
        String s = d.toPlainString();
        return s.equals("-0") ? "0" : s;
    }

    private boolean isDigitalSource(String signalName) {
        for (DigitalChannel d : settings.digitalChannels()) {
            if (d.signalName().equals(signalName)) {
                return true;
            }
        }
        return false;
    }

    private static int indexOf(String[] names, String name) {
        for (int i = 0; i < names.length; i++) {
            if (names[i].equals(name)) {
                return i;
            }
        }
        return -1;
    }

    /** Path of the .cfg file. */
    public Path cfgPath() {
        return cfgPath;
    }

    /** Path of the .dat file. */
    public Path datPath() {
        return datPath;
    }

    /** Records written so far (flushed or buffered). */
    public long recordCount() {
        return recordCount;
    }

    /** Names of the analog channels, in .cfg order. */
    public List<String> analogChannelNames() {
        return List.of(analogNames);
    }

    /** Range used for analog channel {@code k} (0-based, .cfg order). */
    public SignalRange analogRange(int k) {
        return analogRanges[k];
    }

    /** How many samples of analog channel {@code k} were outside its range and clamped. */
    public long clampedSampleCount(int k) {
        return clampedCounts[k];
    }

    /** How many samples of analog channel {@code k} were NaN and written as missing. */
    public long missingSampleCount(int k) {
        return missingCounts[k];
    }

    /** Total clamped samples over all analog channels. */
    public long totalClampedSampleCount() {
        return Arrays.stream(clampedCounts).sum();
    }

    /** Times a sample's exchange index did not follow the previous one. */
    public long gapCount() {
        return gapCount;
    }

    /** Samples whose stamp did not fit 32 bits and was saturated. */
    public long stampOverflowCount() {
        return stampOverflowCount;
    }

    /** Samples the ring reported as missed by this consumer (from {@link #onEnd}). */
    public long samplesMissed() {
        return samplesMissed;
    }

    /** Samples received but not recorded because of an I/O failure. */
    public long unrecordedSampleCount() {
        return unrecordedSamples;
    }

    /** The I/O error that stopped the recording, or null. */
    public IOException failure() {
        return failure;
    }

    /** Plant time of the last recorded sample, ns. */
    public long lastPlantTimeNs() {
        return lastPlantTimeNs;
    }
}
