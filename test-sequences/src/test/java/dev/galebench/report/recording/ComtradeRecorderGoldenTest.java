package dev.galebench.report.recording;

import dev.galebench.plant.SensorView;
import dev.galebench.report.comtrade.ComtradeConfig;
import dev.galebench.report.comtrade.ComtradeReader;
import dev.galebench.testsupport.ReportFixtures;
import dev.galebench.rt.Sample;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Golden files per COMTRADE revision (write, compare with the reference, read back with the
 * independent reader, write the read-back data again and byte-compare), plus the .cfg layout and .dat record
 * layout checked field by field against IEEE C37.111 as summarised in REFERENCES.md 8a/8b.
 */
class ComtradeRecorderGoldenTest {
    static final String[] NAMES = {"v_term_a_v", "i_grid_a_a", "v_dc_v", "v_term_pu", "frt_active", "trip_flags"};
    static final String[] UNITS = {"V", "A", "V", "pu", "1", "bits"};
    static final long PERIOD_NS = 50_000L;
    static final int COUNT = 8;
    static final Instant ZERO = Instant.parse("2026-03-14T09:26:53.589793Z");

    static RangeSource fixedRanges() {
        return (name, unit) -> switch (name) {
            case "v_term_a_v" -> SignalRange.symmetric(845.07, "test");
            case "i_grid_a_a" -> SignalRange.symmetric(7800.0, "test");
            case "v_dc_v" -> new SignalRange(0.0, 1625.0, "test");
            case "v_term_pu" -> new SignalRange(0.0, 2.0, "test");
            default -> throw new IllegalArgumentException(name);
        };
    }

    static List<DigitalChannel> digital() {
        return List.of(new DigitalChannel("frt_active", 1, "frt_active", 0),
                new DigitalChannel("trip_flags", SensorView.TRIP_DC_OVERVOLTAGE, "trip_dc_overvoltage", 0),
                new DigitalChannel("trip_flags", SensorView.TRIP_GSC_OVERCURRENT, "trip_gsc_overcurrent", 0));
    }

    /** The input: a 50 Hz phase voltage and current, a DC-link ramp with one NaN, a clamped current at the end. */
    static void fill(long k, double t, double[] v) {
        v[0] = 563.4 * Math.sin(2 * Math.PI * 50 * t);
        v[1] = k == 7 ? 9000.0 : 3818.4 * Math.sin(2 * Math.PI * 50 * t - 0.3);
        v[2] = k == 5 ? Double.NaN : 1100.0 + 10.0 * k;
        v[3] = 1.0 - 0.1 * k;
        v[4] = k >= 4 ? 1.0 : 0.0;
        v[5] = k >= 6 ? SensorView.TRIP_DC_OVERVOLTAGE : 0;
    }

    static ComtradeRecorder record(Path dir, int revision) {
        ComtradeSettings s = new ComtradeSettings("GALEBENCH", "golden", revision, 50.0, ZERO, 150_000L, 1.0,
                fixedRanges(), digital(), ComtradeSettings.MAX_FLUSH_INTERVAL_NS);
        ComtradeRecorder r = new ComtradeRecorder(dir, "golden-" + revision, s);
        r.onStart(NAMES, UNITS, PERIOD_NS, 1);
        ReportFixtures.feed(r, NAMES, PERIOD_NS, COUNT, ComtradeRecorderGoldenTest::fill);
        r.onEnd(0);
        return r;
    }

    static byte[] resource(String name) throws IOException {
        try (InputStream in = ComtradeRecorderGoldenTest.class.getResourceAsStream("/dev/galebench/report/comtrade/" + name)) {
            if (in == null) {
                throw new IOException("golden file missing: " + name + " (run with -Dgalebench.updateGolden=true once)");
            }
            return in.readAllBytes();
        }
    }

    @ParameterizedTest
    @ValueSource(ints = {1999, 2013})
    void shouldWriteExactlyTheGoldenFilesAndReadThemBack(int revision, @TempDir Path dir) throws IOException {
        ComtradeRecorder r = record(dir, revision);
        byte[] cfg = Files.readAllBytes(r.cfgPath());
        byte[] dat = Files.readAllBytes(r.datPath());
        if (Boolean.getBoolean("galebench.updateGolden")) {
            Path golden = Paths.get("src/test/resources/dev/galebench/report/comtrade");
            Files.write(golden.resolve("golden-" + revision + ".cfg"), cfg);
            Files.write(golden.resolve("golden-" + revision + ".dat"), dat);
        }
        assertArrayEquals(resource("golden-" + revision + ".cfg"), cfg, "cfg differs from golden-" + revision + ".cfg");
        assertArrayEquals(resource("golden-" + revision + ".dat"), dat, "dat differs from golden-" + revision + ".dat");

        // read back through the independent reader: every value within half a code step
        ComtradeReader reader = ComtradeReader.open(r.cfgPath());
        ComtradeConfig c = reader.config();
        assertEquals(revision, c.revisionYear);
        assertEquals(COUNT, c.announcedRecordCount());
        double[] expected = new double[NAMES.length];
        List<String> problems = new ArrayList<>();
        long read = reader.read((n, t, analog, status) -> {
            long k = n - 1;
            fill(k, (k + 1) * PERIOD_NS * 1e-9, expected);
            if (Math.abs(t - k * PERIOD_NS * 1e-9) > 1e-12) {
                problems.add("time of record " + n + ": " + t);
            }
            for (int ch = 0; ch < 4; ch++) {
                double halfStep = c.analogChannels.get(ch).a() / 2 + 1e-9;
                double want = expected[ch];
                if (ch == 1 && k == 7) {
                    want = 7800.0; // clamped to the top of the range
                }
                if (Double.isNaN(want) != Double.isNaN(analog[ch]) || Math.abs(want - analog[ch]) > halfStep) {
                    problems.add("record " + n + " channel " + NAMES[ch] + ": wrote " + want + ", read " + analog[ch]);
                }
            }
            if (status[0] != (k >= 4) || status[1] != (k >= 6) || status[2]) {
                problems.add("status of record " + n);
            }
        });
        assertEquals(COUNT, read);
        assertEquals(List.of(), problems);
        assertEquals(1, r.clampedSampleCount(1));
        assertEquals(1, r.missingSampleCount(2));
        assertEquals(0, r.clampedSampleCount(0));

        // write again what was read back: byte-identical to the golden files
        Path again = Files.createDirectory(dir.resolve("again"));
        ComtradeSettings s = new ComtradeSettings("GALEBENCH", "golden", revision, 50.0, ZERO, 150_000L, 1.0,
                fixedRanges(), digital(), ComtradeSettings.MAX_FLUSH_INTERVAL_NS);
        ComtradeRecorder r2 = new ComtradeRecorder(again, "golden-" + revision, s);
        r2.onStart(NAMES, UNITS, PERIOD_NS, 1);
        Sample sample = new Sample(NAMES.length);
        long firstPlantTimeNs = PERIOD_NS; // exchange 0 ends at plant time one period
        ComtradeReader.open(r.cfgPath()).read((n, t, analog, status) -> {
            sample.exchangeIndex = n - 1;
            sample.plantTimeNs = firstPlantTimeNs + Math.round(t * 1e9);
            System.arraycopy(analog, 0, sample.values, 0, 4);
            sample.values[4] = status[0] ? 1 : 0;
            sample.values[5] = (status[1] ? SensorView.TRIP_DC_OVERVOLTAGE : 0) | (status[2] ? SensorView.TRIP_GSC_OVERCURRENT : 0);
            r2.onSample(sample);
        });
        r2.onEnd(0);
        assertArrayEquals(cfg, Files.readAllBytes(r2.cfgPath()), "cfg written from the read-back data differs");
        assertArrayEquals(dat, Files.readAllBytes(r2.datPath()), "dat written from the read-back data differs");
    }

    @Test
    void shouldLayOutTheCfgLineByLineAsTheStandardSays(@TempDir Path dir) throws IOException {
        ComtradeRecorder r = record(dir, 2013);
        String text = Files.readString(r.cfgPath(), StandardCharsets.US_ASCII);
        assertTrue(text.endsWith("\r\n"));
        String[] lines = text.split("\r\n");
        assertEquals("GALEBENCH,golden,2013", lines[0]);
        assertEquals("7,4A,3D", lines[1]);
        // An,ch_id,ph,ccbm,uu,a,b,skew,min,max,primary,secondary,PS: a = 2 x 845.07 / 65534 to 9 digits
        assertEquals("1,v_term_a_v,A,,V,0.0257902768,0,0,-32767,32767,1,1,P", lines[2]);
        assertEquals("3,v_dc_v,,,V,0.0247962889,812.5,0,-32767,32767,1,1,P", lines[4]);
        assertEquals("1,frt_active,,frt_active,0", lines[6]);
        assertEquals("3,trip_gsc_overcurrent,,trip_flags,0", lines[8]);
        assertEquals("50", lines[9]);
        assertEquals("1", lines[10]);
        assertEquals("20000,8", lines[11]);
        assertEquals("14/03/2026,09:26:53.589843", lines[12]); // plant time zero + first sample at 50 us
        assertEquals("14/03/2026,09:26:53.589943", lines[13]); // trigger at plant time 150 us
        assertEquals("BINARY", lines[14]);
        assertEquals("1", lines[15]);
        assertEquals("0,0", lines[16]);
        assertEquals("F,3", lines[17]);
        assertEquals(18, lines.length);
    }

    @Test
    void shouldLayOutEachBinaryRecordAsTheStandardSays(@TempDir Path dir) throws IOException {
        ComtradeRecorder r = record(dir, 2013);
        byte[] dat = Files.readAllBytes(r.datPath());
        int recordBytes = 8 + 2 * 4 + 2; // n, stamp, 4 x int16, one status word
        assertEquals(COUNT * recordBytes, dat.length);
        ByteBuffer b = ByteBuffer.wrap(dat).order(ByteOrder.LITTLE_ENDIAN);
        double a0 = 2 * 845.07 / 65534;
        for (int k = 0; k < COUNT; k++) {
            b.position(k * recordBytes);
            assertEquals(k + 1, b.getInt(), "sample number");
            assertEquals(50 * k, b.getInt(), "time stamp in us");
            double v0 = 563.4 * Math.sin(2 * Math.PI * 50 * (k + 1) * 50e-6);
            assertEquals(Math.rint(v0 / a0), b.getShort(), 1.0, "v_term_a_v code");
            b.getShort();
            short vdc = b.getShort();
            if (k == 5) {
                assertEquals((short) 0x8000, vdc, "missing value code");
            }
            b.getShort();
            int word = b.getShort() & 0xFFFF;
            assertEquals((k >= 4 ? 1 : 0) | (k >= 6 ? 2 : 0), word, "status word of record " + (k + 1));
        }
        b.position(7 * recordBytes + 10);
        assertEquals(32767, b.getShort(), "clamped current at the top code");
    }
}
