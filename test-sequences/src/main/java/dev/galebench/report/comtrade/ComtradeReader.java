package dev.galebench.report.comtrade;

import java.io.BufferedInputStream;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Streams the records of a COMTRADE recording ({@code .cfg} + {@code .dat}) in ASCII, BINARY,
 * BINARY32 or FLOAT32 format, without holding the file in memory: one record at a time is
 * decoded into arrays the caller's {@link RecordVisitor} must copy from.
 *
 * <p>.dat layouts (IEEE C37.111, little-endian for the binary forms):
 * <pre>
 * ASCII    n,timestamp,A1..AnA,D1..DnD          one line per record; 99999 = missing analog
 * BINARY   uint32 n | uint32 timestamp | int16 x nA | uint16 x ceil(nD/16)   0x8000 = missing
 * BINARY32 as BINARY with int32 analogs                                   0x80000000 = missing
 * FLOAT32  as BINARY with IEEE-754 float32 analogs
 * </pre>
 * Status bits are packed 16 per word, the lowest channel in the least significant bit.
 *
 * <p>The number of records read is the smaller of what the .cfg announces and what the .dat
 * holds, so a recording cut off while it was written (the .cfg rewritten less often than the
 * .dat grows) reads up to its last complete record.
 *
 * <p>Time of record n: with sampling rates given, the sum over rates of (samples at that
 * rate) / rate, i.e. {@code (n - 1) / samp} for one rate; with {@code nrates = 0},
 * {@code timestamp * timemult} in microseconds (nanoseconds if the .cfg date stamps carry
 * 7 to 9 decimals).
 */
public final class ComtradeReader {
    /** Receives one decoded record; the arrays are reused for the next record. */
    @FunctionalInterface
    public interface RecordVisitor {
        /**
         * @param sampleNumber the record's sample number n as stored
         * @param timeS        time of the record since the first sample, s
         * @param analog       channel values a * code + b in the channel unit; NaN where missing
         * @param status       status channel states
         */
        void record(long sampleNumber, double timeS, double[] analog, boolean[] status);
    }

    private final ComtradeConfig config;
    private final Path datPath;

    private ComtradeReader(ComtradeConfig config, Path datPath) {
        this.config = config;
        this.datPath = datPath;
    }

    /** Opens {@code base.cfg} and finds the {@code .dat} beside it (either case of extension). */
    public static ComtradeReader open(Path cfgPath) throws IOException {
        ComtradeConfig cfg = ComtradeConfig.read(cfgPath);
        String name = cfgPath.getFileName().toString();
        String base = name.substring(0, name.length() - 4);
        Path dat = cfgPath.resolveSibling(base + ".dat");
        if (!Files.exists(dat)) {
            dat = cfgPath.resolveSibling(base + ".DAT");
        }
        if (!Files.exists(dat)) {
            throw new IOException(cfgPath + ": no data file " + base + ".dat beside it");
        }
        return new ComtradeReader(cfg, dat);
    }

    /** A reader over an already parsed configuration and a data file. */
    public static ComtradeReader of(ComtradeConfig config, Path datPath) {
        return new ComtradeReader(config, datPath);
    }

    public ComtradeConfig config() {
        return config;
    }

    /** The data file read. */
    public Path datPath() {
        return datPath;
    }

    /** Bytes of one binary record; 0 for ASCII. */
    public int binaryRecordBytes() {
        int nA = config.analogChannels.size();
        int words = (config.statusChannels.size() + 15) / 16;
        return switch (config.fileType) {
            case "BINARY" -> 8 + 2 * nA + 2 * words;
            case "BINARY32", "FLOAT32" -> 8 + 4 * nA + 2 * words;
            default -> 0;
        };
    }

    /** Reads every record in order; returns how many were read. */
    public long read(RecordVisitor visitor) throws IOException {
        if (config.fileType.equals("ASCII")) {
            return readAscii(visitor);
        }
        return readBinary(visitor);
    }

    private long readBinary(RecordVisitor visitor) throws IOException {
        final int recordBytes = binaryRecordBytes();
        final long inFile = Files.size(datPath) / recordBytes;
        final long count = Math.min(inFile, config.announcedRecordCount());
        final int nA = config.analogChannels.size();
        final int nD = config.statusChannels.size();
        final int words = (nD + 15) / 16;
        final double[] a = new double[nA];
        final double[] b = new double[nA];
        for (int k = 0; k < nA; k++) {
            a[k] = config.analogChannels.get(k).a();
            b[k] = config.analogChannels.get(k).b();
        }
        final double[] values = new double[nA];
        final boolean[] status = new boolean[nD];
        final byte[] raw = new byte[recordBytes];
        final ByteBuffer rec = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        final int type = switch (config.fileType) {
            case "BINARY" -> 16;
            case "BINARY32" -> 32;
            default -> 0; // FLOAT32
        };
        final TimeBase time = new TimeBase(config);
        try (InputStream in = new BufferedInputStream(Files.newInputStream(datPath), 1 << 16)) {
            for (long r = 0; r < count; r++) {
                if (in.readNBytes(raw, 0, recordBytes) != recordBytes) {
                    return r;
                }
                rec.clear();
                long n = rec.getInt() & 0xFFFF_FFFFL;
                long stamp = rec.getInt() & 0xFFFF_FFFFL;
                for (int k = 0; k < nA; k++) {
                    if (type == 16) {
                        short code = rec.getShort();
                        values[k] = code == (short) 0x8000 ? Double.NaN : a[k] * code + b[k];
                    } else if (type == 32) {
                        int code = rec.getInt();
                        values[k] = code == 0x8000_0000 ? Double.NaN : a[k] * code + b[k];
                    } else {
                        values[k] = a[k] * rec.getFloat() + b[k];
                    }
                }
                for (int w = 0; w < words; w++) {
                    int word = rec.getShort() & 0xFFFF;
                    for (int bit = 0; bit < 16 && w * 16 + bit < nD; bit++) {
                        status[w * 16 + bit] = (word & (1 << bit)) != 0;
                    }
                }
                visitor.record(n, time.timeS(r, stamp), values, status);
            }
        }
        return count;
    }

    private long readAscii(RecordVisitor visitor) throws IOException {
        final int nA = config.analogChannels.size();
        final int nD = config.statusChannels.size();
        final double[] values = new double[nA];
        final boolean[] status = new boolean[nD];
        final long count = config.announcedRecordCount();
        final TimeBase time = new TimeBase(config);
        long r = 0;
        try (BufferedReader in = Files.newBufferedReader(datPath, StandardCharsets.US_ASCII)) {
            String line;
            while (r < count && (line = in.readLine()) != null) {
                if (line.isBlank()) {
                    continue;
                }
                String[] f = line.split(",", -1);
                if (f.length < 2 + nA + nD) {
                    throw new IOException(datPath.getFileName() + ": record " + (r + 1) + " has " + f.length
                            + " fields, needs " + (2 + nA + nD));
                }
                long n = Long.parseLong(f[0].trim());
                String stampText = f[1].trim();
                long stamp = stampText.isEmpty() ? -1 : Long.parseLong(stampText);
                for (int k = 0; k < nA; k++) {
                    String s = f[2 + k].trim();
                    if (s.isEmpty() || s.equals("99999")) {
                        values[k] = Double.NaN;
                    } else {
                        ComtradeConfig.AnalogChannel c = config.analogChannels.get(k);
                        values[k] = c.a() * Double.parseDouble(s) + c.b();
                    }
                }
                for (int k = 0; k < nD; k++) {
                    status[k] = Integer.parseInt(f[2 + nA + k].trim()) != 0;
                }
                visitor.record(n, time.timeS(r, stamp), values, status);
                r++;
            }
        }
        return r;
    }

    /** Converts a record index or stamp into seconds since the first sample. */
    private static final class TimeBase {
        private final ComtradeConfig cfg;
        private final double secondsPerStamp;

        TimeBase(ComtradeConfig cfg) {
            this.cfg = cfg;
            this.secondsPerStamp = cfg.timeMultiplier * cfg.stampUnitNs * 1e-9;
        }

        double timeS(long recordIndex, long stamp) {
            if (cfg.stampsCritical || cfg.sampleRates.get(0).rateHz() <= 0.0) {
                return stamp * secondsPerStamp;
            }
            double t = 0.0;
            long before = 0;
            long n = recordIndex + 1;
            for (ComtradeConfig.SampleRate rate : cfg.sampleRates) {
                long upTo = Math.min(n, rate.lastSample());
                if (upTo > before) {
                    // the first sample of the file sits at t = 0
                    t += (upTo - before - (before == 0 ? 1 : 0)) / rate.rateHz();
                    before = upTo;
                }
                if (n <= rate.lastSample()) {
                    return t;
                }
            }
            return t;
        }
    }
}
