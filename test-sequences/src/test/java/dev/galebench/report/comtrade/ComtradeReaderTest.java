package dev.galebench.report.comtrade;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDateTime;
import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The independent COMTRADE reader against the standard's layout (IEEE C37.111-2013 /
 * IEC 60255-24:2013 as summarised in REFERENCES.md section 8, confirmed there from several
 * independent parsers), starting with the section 8c worked example.
 */
class ComtradeReaderTest {
    record Row(long n, double timeS, double[] analog, boolean[] status) {
    }

    static List<Row> readAll(ComtradeReader r) throws IOException {
        List<Row> rows = new ArrayList<>();
        r.read((n, t, a, s) -> rows.add(new Row(n, t, a.clone(), s.clone())));
        return rows;
    }

    static Path copyResource(Path dir, String name) throws IOException {
        try (InputStream in = ComtradeReaderTest.class.getResourceAsStream(name)) {
            Path p = dir.resolve(name);
            Files.copy(in, p);
            return p;
        }
    }

    @Test
    void shouldParseWorkedExampleConfigurationExactly(@TempDir Path dir) throws IOException {
        // REFERENCES.md 8c: every field of the .cfg as written there
        ComtradeConfig c = ComtradeConfig.read(copyResource(dir, "worked-example.cfg"));
        assertEquals("WT_BENCH", c.stationName);
        assertEquals("SIM01", c.recordingDeviceId);
        assertEquals(2013, c.revisionYear);
        assertEquals(2, c.analogChannels.size());
        assertEquals(1, c.statusChannels.size());
        assertEquals(new ComtradeConfig.AnalogChannel(1, "UA", "A", "PCC", "V", 0.05, 0.0, 0.0, -32767, 32767, 1, 1, 'P'),
                c.analogChannels.get(0));
        assertEquals(new ComtradeConfig.AnalogChannel(2, "IA", "A", "PCC", "A", 0.01, 0.0, 0.0, -32767, 32767, 1, 1, 'P'),
                c.analogChannels.get(1));
        assertEquals(new ComtradeConfig.StatusChannel(1, "FRT_ACTIVE", "", "WT1", 0), c.statusChannels.get(0));
        assertEquals(50.0, c.lineFrequencyHz);
        assertFalse(c.stampsCritical);
        assertEquals(List.of(new ComtradeConfig.SampleRate(10000.0, 5)), c.sampleRates);
        assertEquals(LocalDateTime.of(2024, 6, 1, 12, 0, 0, 0), c.firstSampleTime);
        assertEquals(LocalDateTime.of(2024, 6, 1, 12, 0, 0, 200_000), c.triggerTime);
        assertEquals("ASCII", c.fileType);
        assertEquals(1.0, c.timeMultiplier);
        assertEquals(1000.0, c.stampUnitNs);
        assertEquals("0", c.timeCode);
        assertEquals("0", c.localCode);
        assertEquals("0", c.timeQualityCode);
        assertEquals("0", c.leapSecond);
        assertEquals(5, c.announcedRecordCount());
    }

    @Test
    void shouldReadWorkedExampleAsciiDataExactly(@TempDir Path dir) throws IOException {
        Path cfg = copyResource(dir, "worked-example.cfg");
        copyResource(dir, "worked-example.dat");
        List<Row> rows = readAll(ComtradeReader.open(cfg));
        assertEquals(5, rows.size());
        // REFERENCES.md 8c: "Sample 2 reads UA = 0.05 * 6180 = 309.0 V and IA = 10.00 A at t = 100 us"
        Row r2 = rows.get(1);
        assertEquals(2, r2.n());
        assertEquals(100e-6, r2.timeS(), 1e-12);
        assertEquals(309.0, r2.analog()[0], 1e-9);
        assertEquals(10.00, r2.analog()[1], 1e-9);
        assertFalse(r2.status()[0]);
        double[] ua = {0, 309.0, 587.8, 809.0, 951.05};
        double[] ia = {0, 10.0, 19.02, 26.18, 30.78};
        boolean[] frt = {false, false, false, true, true};
        for (int i = 0; i < 5; i++) {
            assertEquals(i + 1, rows.get(i).n());
            assertEquals(i * 100e-6, rows.get(i).timeS(), 1e-12);
            assertEquals(ua[i], rows.get(i).analog()[0], 1e-9);
            assertEquals(ia[i], rows.get(i).analog()[1], 1e-9);
            assertEquals(frt[i], rows.get(i).status()[0]);
        }
    }

    /** The same example as BINARY, bytes laid out by hand from REFERENCES.md 8b (14 bytes a record). */
    @Test
    void shouldReadWorkedExampleAsBinaryWithFourteenByteRecords(@TempDir Path dir) throws IOException {
        String cfgText = new String(ComtradeReaderTest.class.getResourceAsStream("worked-example.cfg").readAllBytes(),
                StandardCharsets.US_ASCII).replace("\r\nASCII\r\n", "\r\nBINARY\r\n");
        Path cfg = dir.resolve("bin.cfg");
        Files.writeString(cfg, cfgText, StandardCharsets.US_ASCII);
        int[][] recs = {{1, 0, 0, 0, 0}, {2, 100, 6180, 1000, 0}, {3, 200, 11756, 1902, 0}, {4, 300, 16180, 2618, 1},
                {5, 400, 19021, 3078, 1}};
        ByteBuffer b = ByteBuffer.allocate(5 * 14).order(ByteOrder.LITTLE_ENDIAN);
        for (int[] r : recs) {
            b.putInt(r[0]).putInt(r[1]).putShort((short) r[2]).putShort((short) r[3]).putShort((short) r[4]);
        }
        Files.write(dir.resolve("bin.dat"), b.array());
        ComtradeReader reader = ComtradeReader.open(cfg);
        assertEquals(14, reader.binaryRecordBytes());
        List<Row> rows = readAll(reader);
        assertEquals(5, rows.size());
        assertEquals(309.0, rows.get(1).analog()[0], 1e-9);
        assertEquals(10.0, rows.get(1).analog()[1], 1e-9);
        assertTrue(rows.get(3).status()[0]);
        assertEquals(400e-6, rows.get(4).timeS(), 1e-12);
    }

    @Test
    void shouldReadNoMoreRecordsThanTheDatHoldsWhenTheCfgAnnouncesMore(@TempDir Path dir) throws IOException {
        String cfgText = new String(ComtradeReaderTest.class.getResourceAsStream("worked-example.cfg").readAllBytes(),
                StandardCharsets.US_ASCII).replace("\r\nASCII\r\n", "\r\nBINARY\r\n");
        Path cfg = dir.resolve("cut.cfg");
        Files.writeString(cfg, cfgText, StandardCharsets.US_ASCII);
        ByteBuffer b = ByteBuffer.allocate(2 * 14 + 5).order(ByteOrder.LITTLE_ENDIAN);
        b.putInt(1).putInt(0).putShort((short) 1).putShort((short) 2).putShort((short) 0);
        b.putInt(2).putInt(100).putShort((short) 3).putShort((short) 4).putShort((short) 1);
        Files.write(dir.resolve("cut.dat"), b.array()); // 2 whole records and 5 bytes of a third
        List<Row> rows = readAll(ComtradeReader.open(cfg));
        assertEquals(2, rows.size());
        assertEquals(0.15, rows.get(1).analog()[0], 1e-12);
    }

    @Test
    void shouldUseStampsWhenRatesAreZeroAndNanosecondStampsWhenDatesHaveNineDecimals(@TempDir Path dir) throws IOException {
        String cfgText = "S,D,2013\r\n1,1A,0D\r\n1,X,,,V,1,0,0,-32767,32767,1,1,P\r\n60\r\n0\r\n0,2\r\n"
                + "01/06/2024,12:00:00.000000000\r\n01/06/2024,12:00:00.000000000\r\nASCII\r\n2\r\n0,0\r\n0,0\r\n";
        Files.writeString(dir.resolve("ns.cfg"), cfgText);
        Files.writeString(dir.resolve("ns.dat"), "1,0,5\r\n2,750,6\r\n");
        ComtradeReader r = ComtradeReader.open(dir.resolve("ns.cfg"));
        assertTrue(r.config().stampsCritical);
        assertEquals(1.0, r.config().stampUnitNs);
        List<Row> rows = readAll(r);
        assertEquals(750 * 2 * 1e-9, rows.get(1).timeS(), 1e-15); // stamp x timemult x 1 ns
    }

    @Test
    void shouldReadRevision1991WithMonthFirstDatesAndNoTimeMultiplier(@TempDir Path dir) throws IOException {
        String cfgText = "OLD,REC\r\n1,0A,1D\r\n1,TRIP,1\r\n60\r\n1\r\n1200,3\r\n06/01/94,12:00:00.000000\r\n06/01/94,12:00:00.000000\r\nASCII\r\n";
        ComtradeConfig c = ComtradeConfig.parse(cfgText, "old.cfg");
        assertEquals(1991, c.revisionYear);
        assertEquals(LocalDateTime.of(1994, 6, 1, 12, 0), c.firstSampleTime);
        assertEquals(1, c.statusChannels.get(0).normalState());
        assertEquals(1.0, c.timeMultiplier);
    }

    @Test
    void shouldNameFileAndLineOfABadField() {
        String bad = "S,D,2013\r\n1,1A,0D\r\n1,X,,,V,abc,0,0,-32767,32767,1,1,P\r\n";
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ComtradeConfig.parse(bad, "bad.cfg"));
        assertEquals("bad.cfg: line 3: a must be a number, got 'abc'", e.getMessage());
        IllegalArgumentException e2 = assertThrows(IllegalArgumentException.class,
                () -> ComtradeConfig.parse("S,D,2013\r\n3,1A,1D\r\n", "count.cfg"));
        assertTrue(e2.getMessage().startsWith("count.cfg: line 2: TT = 3"), e2.getMessage());
    }
}
