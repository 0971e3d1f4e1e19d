package dev.galebench.report;

import javax.xml.stream.XMLOutputFactory;
import javax.xml.stream.XMLStreamException;
import javax.xml.stream.XMLStreamWriter;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Writes {@code junit.xml} in the JUnit XML result format CI servers read (the format of the
 * Ant {@code junit} task and Maven Surefire; validated in the tests against the schema the
 * Jenkins xUnit plugin uses). Mapping:
 * <ul>
 *   <li>{@code <testsuites>} holds one {@code <testsuite>} per sequence run;</li>
 *   <li>one {@code <testcase>} per check, {@code classname = galebench.<sequence>}; a failed check
 *       has {@code <failure message="measured M, required R" type="<check kind>">} with the
 *       check's sentence as text;</li>
 *   <li>one more testcase, {@code run_integrity}: an {@code <error>} when the run was aborted, a
 *       {@code <failure>} when samples were dropped, so CI shows a broken run even when every
 *       check that did run passed;</li>
 *   <li>{@code <properties>}: step, exchange ratio, exchanges, overruns, samples dropped and the
 *       environment; {@code time} is the run's plant time in seconds.</li>
 * </ul>
 */
public final class JunitXml {
    /** Name of the extra testcase that judges the run itself. */
    public static final String RUN_INTEGRITY = "run_integrity";
    private static final DateTimeFormatter TIMESTAMP = DateTimeFormatter.ofPattern("yyyy-MM-dd'T'HH:mm:ss");

    private JunitXml() {
    }

    /** Writes {@code runDir/junit.xml} for one run. */
    public static Path write(Path runDir, RunReportInput in) throws IOException {
        return write(runDir.resolve(RunReports.JUNIT_XML), List.of(in));
    }

    /** Writes one file with one testsuite per run (a batch of sequences). */
    public static Path write(Path file, List<RunReportInput> runs) throws IOException {
        try (OutputStream out = Files.newOutputStream(file)) {
            XMLStreamWriter w = XMLOutputFactory.newFactory().createXMLStreamWriter(out, "UTF-8");
            w.writeStartDocument("UTF-8", "1.0");
            w.writeCharacters("\n");
            long tests = 0;
            long failures = 0;
            long errors = 0;
            double time = 0;
            for (RunReportInput in : runs) {
                tests += in.checks().size() + 1;
                failures += in.failedCheckCount() + (in.abortedReason() == null && in.samplesDropped() > 0 ? 1 : 0);
                errors += in.abortedReason() != null ? 1 : 0;
                time += in.plantDurationS();
            }
            w.writeStartElement("testsuites");
            w.writeAttribute("name", "galebench");
            w.writeAttribute("tests", Long.toString(tests));
            w.writeAttribute("failures", Long.toString(failures));
            w.writeAttribute("errors", Long.toString(errors));
            w.writeAttribute("time", seconds(time));
            w.writeCharacters("\n");
            for (RunReportInput in : runs) {
                writeSuite(w, in);
            }
            w.writeEndElement();
            w.writeCharacters("\n");
            w.writeEndDocument();
            w.close();
        } catch (XMLStreamException e) {
            throw new IOException("cannot write " + file + ": " + e.getMessage(), e);
        }
        return file;
    }

    private static void writeSuite(XMLStreamWriter w, RunReportInput in) throws XMLStreamException {
        boolean aborted = in.abortedReason() != null;
        boolean dropped = in.samplesDropped() > 0;
        String classname = "galebench." + in.sequenceName().replaceAll("[^A-Za-z0-9_.-]", "_");
        w.writeCharacters("  ");
        w.writeStartElement("testsuite");
        w.writeAttribute("name", clean(in.sequenceName()));
        w.writeAttribute("tests", Integer.toString(in.checks().size() + 1));
        w.writeAttribute("failures", Long.toString(in.failedCheckCount() + (!aborted && dropped ? 1 : 0)));
        w.writeAttribute("errors", aborted ? "1" : "0");
        w.writeAttribute("skipped", "0");
        w.writeAttribute("time", seconds(in.plantDurationS()));
        w.writeAttribute("timestamp", LocalDateTime.ofInstant(in.startedAt(), ZoneOffset.UTC).format(TIMESTAMP));
        w.writeAttribute("hostname", clean(in.environment().getOrDefault("host", "localhost")));
        if (in.sequenceFile() != null) {
            w.writeAttribute("file", clean(in.sequenceFile()));
        }
        w.writeCharacters("\n    ");
        w.writeStartElement("properties");
        property(w, "step_period_us", Double.toString(in.stepPeriodNs() / 1000.0));
        property(w, "exchange_every_steps", Integer.toString(in.exchangeEverySteps()));
        property(w, "exchanges", Long.toString(in.exchanges()));
        property(w, "overruns", Long.toString(in.overruns()));
        property(w, "samples_dropped", Long.toString(in.samplesDropped()));
        for (Map.Entry<String, String> e : in.environment().entrySet()) {
            property(w, "env." + clean(e.getKey()), e.getValue());
        }
        w.writeCharacters("\n    ");
        w.writeEndElement();
        for (CheckOutcome c : in.checks()) {
            w.writeCharacters("\n    ");
            w.writeStartElement("testcase");
            w.writeAttribute("name", clean(c.name()));
            w.writeAttribute("classname", classname);
            w.writeAttribute("time", "0");
            if (!c.passed()) {
                w.writeCharacters("\n      ");
                w.writeStartElement("failure");
                w.writeAttribute("message", clean("measured " + c.measured() + ", required " + c.required()));
                w.writeAttribute("type", c.kind() == null ? "check" : clean(c.kind()));
                w.writeCharacters(clean(c.message()));
                w.writeEndElement();
                w.writeCharacters("\n    ");
            }
            w.writeEndElement();
        }
        w.writeCharacters("\n    ");
        w.writeStartElement("testcase");
        w.writeAttribute("name", RUN_INTEGRITY);
        w.writeAttribute("classname", classname);
        w.writeAttribute("time", seconds(in.plantDurationS()));
        if (aborted) {
            w.writeCharacters("\n      ");
            w.writeStartElement("error");
            w.writeAttribute("message", clean("run aborted: " + in.abortedReason()));
            w.writeAttribute("type", "aborted");
            w.writeCharacters("The run stopped before the end of the sequence; checks after this point were not judged.");
            w.writeEndElement();
            w.writeCharacters("\n    ");
        } else if (dropped) {
            w.writeCharacters("\n      ");
            w.writeStartElement("failure");
            w.writeAttribute("message", "measured " + in.samplesDropped() + " samples dropped, required 0");
            w.writeAttribute("type", "samples_dropped");
            w.writeCharacters("A consumer of the sample ring fell behind; recordings and streaming checks miss samples.");
            w.writeEndElement();
            w.writeCharacters("\n    ");
        }
        w.writeEndElement();
        w.writeCharacters("\n    ");
        w.writeStartElement("system-out");
        w.writeCharacters(String.format(Locale.ROOT, "verdict %s; %d exchanges, %d overruns, %d samples dropped",
                in.verdict(), in.exchanges(), in.overruns(), in.samplesDropped()));
        w.writeEndElement();
        w.writeCharacters("\n  ");
        w.writeEndElement();
        w.writeCharacters("\n");
    }

    private static void property(XMLStreamWriter w, String name, String value) throws XMLStreamException {
        w.writeCharacters("\n      ");
        w.writeEmptyElement("property");
        w.writeAttribute("name", name);
        w.writeAttribute("value", clean(value));
    }

    /** Drops characters XML 1.0 cannot carry (controls other than tab, LF, CR). */
    static String clean(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length());
        for (int i = 0; i < s.length(); i++) {
            char ch = s.charAt(i);
            if (ch >= 0x20 && ch != 0xFFFE && ch != 0xFFFF || ch == '\t' || ch == '\n' || ch == '\r') {
                b.append(ch);
            }
        }
        return b.toString();
    }

    private static String seconds(double s) {
        return String.format(Locale.ROOT, "%.3f", Double.isFinite(s) && s >= 0 ? s : 0.0);
    }
}
