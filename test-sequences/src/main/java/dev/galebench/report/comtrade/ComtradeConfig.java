package dev.galebench.report.comtrade;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDateTime;
import java.util.ArrayList;
import java.util.List;

/**
 * A parsed COMTRADE configuration ({@code .cfg}) file, revisions 1991, 1999 and 2013 of IEEE
 * C37.111 (= IEC 60255-24:2013). Written from the standard's line-by-line layout, independent of
 * galebench's own writer, so a round trip through it checks the writer against the standard
 * rather than against itself.
 *
 * <p>Layout read (one item per line, fields separated by commas, CR LF or LF line ends):
 * <pre>
 * station_name,rec_dev_id[,rev_year]         rev_year absent = 1991
 * TT,##A,##D                                   total, analog and status channel counts
 * An,ch_id,ph,ccbm,uu,a,b,skew,min,max[,primary,secondary,PS]   one per analog channel
 * Dn,ch_id,ph,ccbm[,y]                         one per status channel (1991: Dn,ch_id,y)
 * lf                                           nominal line frequency, Hz
 * nrates                                       number of sampling rates (0 = stamps are critical)
 * samp,endsamp                                 max(nrates, 1) lines
 * dd/mm/yyyy,hh:mm:ss.ssssss                   first data point (1991: mm/dd/yy); 7-9 decimals = ns stamps
 * dd/mm/yyyy,hh:mm:ss.ssssss                   trigger point
 * ft                                           ASCII, BINARY, BINARY32 or FLOAT32
 * timemult                                     1999 and later (default 1)
 * time_code,local_code                         2013
 * tmq_code,leapsec                             2013
 * </pre>
 *
 * <p>Every problem is reported with the file name and the 1-based line number.
 */
public final class ComtradeConfig {
    /** One analog channel; the value in unit {@code unit} is {@code a * code + b}. */
    public record AnalogChannel(int index, String id, String phase, String circuit, String unit, double a, double b,
                                double skewUs, double minCode, double maxCode, double primary, double secondary,
                                char primaryOrSecondary) {
    }

    /** One status channel; {@code normalState} is 0 or 1. */
    public record StatusChannel(int index, String id, String phase, String circuit, int normalState) {
    }

    /** One sampling rate: {@code rateHz} up to and including sample number {@code lastSample}. */
    public record SampleRate(double rateHz, long lastSample) {
    }

    public final String stationName;
    public final String recordingDeviceId;
    public final int revisionYear;
    public final List<AnalogChannel> analogChannels;
    public final List<StatusChannel> statusChannels;
    public final double lineFrequencyHz;
    /** As written; an empty list when nrates was 0 is represented by {@link #stampsCritical}. */
    public final List<SampleRate> sampleRates;
    public final boolean stampsCritical;
    public final LocalDateTime firstSampleTime;
    public final LocalDateTime triggerTime;
    /** ASCII, BINARY, BINARY32 or FLOAT32. */
    public final String fileType;
    public final double timeMultiplier;
    /** Nanoseconds per .dat stamp unit before {@link #timeMultiplier}: 1000, or 1 when the date stamps carry ns. */
    public final double stampUnitNs;
    public final String timeCode;
    public final String localCode;
    public final String timeQualityCode;
    public final String leapSecond;

    private ComtradeConfig(Builder b) {
        stationName = b.stationName;
        recordingDeviceId = b.recordingDeviceId;
        revisionYear = b.revisionYear;
        analogChannels = List.copyOf(b.analog);
        statusChannels = List.copyOf(b.status);
        lineFrequencyHz = b.lineFrequencyHz;
        sampleRates = List.copyOf(b.rates);
        stampsCritical = b.stampsCritical;
        firstSampleTime = b.first;
        triggerTime = b.trigger;
        fileType = b.fileType;
        timeMultiplier = b.timeMultiplier;
        stampUnitNs = b.stampUnitNs;
        timeCode = b.timeCode;
        localCode = b.localCode;
        timeQualityCode = b.tmq;
        leapSecond = b.leap;
    }

    /** Number of records the .cfg announces: the last sample number of the last rate. */
    public long announcedRecordCount() {
        return sampleRates.isEmpty() ? 0 : sampleRates.get(sampleRates.size() - 1).lastSample();
    }

    /** Index (0-based) of the analog channel with id {@code id}, or -1. */
    public int analogIndexOf(String id) {
        for (int i = 0; i < analogChannels.size(); i++) {
            if (analogChannels.get(i).id().equals(id)) {
                return i;
            }
        }
        return -1;
    }

    /** Index (0-based) of the status channel with id {@code id}, or -1. */
    public int statusIndexOf(String id) {
        for (int i = 0; i < statusChannels.size(); i++) {
            if (statusChannels.get(i).id().equals(id)) {
                return i;
            }
        }
        return -1;
    }

    /** Reads and parses a .cfg file (ASCII/UTF-8 text). */
    public static ComtradeConfig read(Path cfg) throws IOException {
        String text = new String(Files.readAllBytes(cfg), StandardCharsets.UTF_8);
        return parse(text, cfg.getFileName().toString());
    }

    /** Parses .cfg text; {@code source} names the file in error messages. */
    public static ComtradeConfig parse(String text, String source) {
        List<String> lines = new ArrayList<>(List.of(text.split("\r?\n", -1)));
        while (!lines.isEmpty() && lines.get(lines.size() - 1).isBlank()) {
            lines.remove(lines.size() - 1);
        }
        return new Parser(lines, source).parse();
    }

    private static final class Builder {
        String stationName;
        String recordingDeviceId;
        int revisionYear;
        final List<AnalogChannel> analog = new ArrayList<>();
        final List<StatusChannel> status = new ArrayList<>();
        double lineFrequencyHz;
        final List<SampleRate> rates = new ArrayList<>();
        boolean stampsCritical;
        LocalDateTime first;
        LocalDateTime trigger;
        String fileType;
        double timeMultiplier = 1.0;
        double stampUnitNs = 1000.0;
        String timeCode = "";
        String localCode = "";
        String tmq = "";
        String leap = "";
    }

    private static final class Parser {
        private final List<String> lines;
        private final String source;
        private int next;

        Parser(List<String> lines, String source) {
            this.lines = lines;
            this.source = source;
        }

        ComtradeConfig parse() {
            Builder b = new Builder();
            String[] f = fields("station_name,rec_dev_id,rev_year");
            b.stationName = f[0];
            b.recordingDeviceId = f.length > 1 ? f[1] : "";
            b.revisionYear = f.length > 2 && !f[2].isEmpty() ? (int) integer(f[2], "rev_year") : 1991;
            if (b.revisionYear != 1991 && b.revisionYear != 1999 && b.revisionYear != 2013) {
                throw error("rev_year must be 1991, 1999 or 2013, got " + b.revisionYear);
            }
            f = fields("TT,##A,##D");
            need(f, 3, "TT,##A,##D");
            long total = integer(f[0], "TT");
            int nA = (int) countWithSuffix(f[1], 'A');
            int nD = (int) countWithSuffix(f[2], 'D');
            if (total != nA + nD) {
                throw error("TT = " + total + " but " + nA + "A + " + nD + "D = " + (nA + nD));
            }
            for (int i = 0; i < nA; i++) {
                f = fields("analog channel " + (i + 1));
                need(f, 10, "An,ch_id,ph,ccbm,uu,a,b,skew,min,max");
                double primary = f.length > 10 && !f[10].isEmpty() ? real(f[10], "primary") : 1.0;
                double secondary = f.length > 11 && !f[11].isEmpty() ? real(f[11], "secondary") : 1.0;
                char ps = f.length > 12 && !f[12].isEmpty() ? Character.toUpperCase(f[12].charAt(0)) : 'P';
                if (ps != 'P' && ps != 'S') {
                    throw error("PS must be P or S, got '" + f[12] + "'");
                }
                b.analog.add(new AnalogChannel((int) integer(f[0], "An"), f[1], f[2], f[3], f[4], real(f[5], "a"),
                        real(f[6], "b"), f[7].isEmpty() ? 0.0 : real(f[7], "skew"), real(f[8], "min"), real(f[9], "max"),
                        primary, secondary, ps));
            }
            for (int i = 0; i < nD; i++) {
                f = fields("status channel " + (i + 1));
                if (b.revisionYear == 1991 && f.length == 3) {
                    b.status.add(new StatusChannel((int) integer(f[0], "Dn"), f[1], "", "", (int) integer(f[2], "y")));
                } else {
                    need(f, 4, "Dn,ch_id,ph,ccbm,y");
                    int y = f.length > 4 && !f[4].isEmpty() ? (int) integer(f[4], "y") : 0;
                    if (y != 0 && y != 1) {
                        throw error("normal state y must be 0 or 1, got " + y);
                    }
                    b.status.add(new StatusChannel((int) integer(f[0], "Dn"), f[1], f[2], f[3], y));
                }
            }
            b.lineFrequencyHz = real(fields("lf")[0], "lf");
            long nrates = integer(fields("nrates")[0], "nrates");
            if (nrates < 0) {
                throw error("nrates must be >= 0");
            }
            b.stampsCritical = nrates == 0;
            for (long i = 0; i < Math.max(nrates, 1); i++) {
                f = fields("samp,endsamp");
                need(f, 2, "samp,endsamp");
                b.rates.add(new SampleRate(real(f[0], "samp"), integer(f[1], "endsamp")));
            }
            String firstLine = peek();
            b.first = dateTime(fields("first data point date,time"), b.revisionYear);
            b.trigger = dateTime(fields("trigger point date,time"), b.revisionYear);
            if (fractionDigits(firstLine) > 6) {
                b.stampUnitNs = 1.0;
            }
            b.fileType = fields("ft")[0].toUpperCase();
            if (!List.of("ASCII", "BINARY", "BINARY32", "FLOAT32").contains(b.fileType)) {
                throw error("file type must be ASCII, BINARY, BINARY32 or FLOAT32, got '" + b.fileType + "'");
            }
            if (b.revisionYear >= 1999 && next < lines.size()) {
                b.timeMultiplier = real(fields("timemult")[0], "timemult");
            }
            if (b.revisionYear == 2013) {
                f = fields("time_code,local_code");
                need(f, 2, "time_code,local_code");
                b.timeCode = f[0];
                b.localCode = f[1];
                f = fields("tmq_code,leapsec");
                need(f, 2, "tmq_code,leapsec");
                b.tmq = f[0];
                b.leap = f[1];
            }
            return new ComtradeConfig(b);
        }

        private String peek() {
            return next < lines.size() ? lines.get(next) : "";
        }

        private String[] fields(String what) {
            if (next >= lines.size()) {
                throw new IllegalArgumentException(source + ": ends before line " + (next + 1) + " (" + what + ")");
            }
            String[] f = lines.get(next++).split(",", -1);
            for (int i = 0; i < f.length; i++) {
                f[i] = f[i].trim();
            }
            return f;
        }

        private void need(String[] f, int n, String what) {
            if (f.length < n) {
                throw error("needs " + n + " fields (" + what + "), found " + f.length);
            }
        }

        private long countWithSuffix(String field, char suffix) {
            if (field.isEmpty() || Character.toUpperCase(field.charAt(field.length() - 1)) != suffix) {
                throw error("channel count '" + field + "' must end in " + suffix);
            }
            return integer(field.substring(0, field.length() - 1), "##" + suffix);
        }

        private long integer(String s, String what) {
            try {
                return Long.parseLong(s.trim());
            } catch (NumberFormatException e) {
                throw error(what + " must be an integer, got '" + s + "'");
            }
        }

        private double real(String s, String what) {
            try {
                return Double.parseDouble(s.trim());
            } catch (NumberFormatException e) {
                throw error(what + " must be a number, got '" + s + "'");
            }
        }

        private LocalDateTime dateTime(String[] f, int rev) {
            need(f, 2, "date,time");
            String[] d = f[0].split("/");
            String[] t = f[1].split(":");
            if (d.length != 3 || t.length != 3) {
                throw error("date,time must look like dd/mm/yyyy,hh:mm:ss.ssssss, got '" + f[0] + "," + f[1] + "'");
            }
            int day;
            int month;
            int year;
            if (rev == 1991) {
                month = (int) integer(d[0], "month");
                day = (int) integer(d[1], "day");
                year = (int) integer(d[2], "year");
                if (d[2].length() <= 2) {
                    year += 1900;
                }
            } else {
                day = (int) integer(d[0], "day");
                month = (int) integer(d[1], "month");
                year = (int) integer(d[2], "year");
            }
            int hour = (int) integer(t[0], "hour");
            int minute = (int) integer(t[1], "minute");
            String sec = t[2];
            int dot = sec.indexOf('.');
            int second = (int) integer(dot < 0 ? sec : sec.substring(0, dot), "second");
            long nanos = 0;
            if (dot >= 0) {
                String frac = sec.substring(dot + 1);
                if (frac.length() > 9) {
                    throw error("fraction of a second has more than 9 digits: '" + sec + "'");
                }
                nanos = frac.isEmpty() ? 0 : integer((frac + "000000000").substring(0, 9), "fraction of a second");
            }
            try {
                return LocalDateTime.of(year, month, day, hour, minute, second, (int) nanos);
            } catch (java.time.DateTimeException e) {
                throw error("invalid date/time '" + f[0] + "," + f[1] + "': " + e.getMessage());
            }
        }

        private static int fractionDigits(String line) {
            int dot = line.lastIndexOf('.');
            return dot < 0 ? 0 : line.length() - dot - 1;
        }

        private IllegalArgumentException error(String message) {
            return new IllegalArgumentException(source + ": line " + next + ": " + message);
        }
    }
}
