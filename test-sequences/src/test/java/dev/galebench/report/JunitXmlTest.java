package dev.galebench.report;

import dev.galebench.testsupport.RunInputs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;
import org.xml.sax.SAXException;

import javax.xml.XMLConstants;
import javax.xml.parsers.DocumentBuilderFactory;
import javax.xml.transform.stream.StreamSource;
import javax.xml.validation.Schema;
import javax.xml.validation.SchemaFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

/**
 * junit.xml against the JUnit XML schema the Jenkins xUnit plugin validates with
 * (src/test/resources/dev/galebench/report/schema/junit-10.xsd, source and MIT licence in SOURCE.md there).
 */
class JunitXmlTest {
    static Schema schema() throws SAXException {
        SchemaFactory f = SchemaFactory.newInstance(XMLConstants.W3C_XML_SCHEMA_NS_URI);
        return f.newSchema(new StreamSource(JunitXmlTest.class.getResource("/dev/galebench/report/schema/junit-10.xsd").toString()));
    }

    static Document validateAndParse(Path file) throws Exception {
        schema().newValidator().validate(new StreamSource(file.toFile()));
        return DocumentBuilderFactory.newInstance().newDocumentBuilder().parse(file.toFile());
    }

    @Test
    void shouldWriteOneSuitePerSequenceOneCasePerCheckAndValidate(@TempDir Path dir) throws Exception {
        Path file = JunitXml.write(dir, RunInputs.failing().build());
        Document d = validateAndParse(file);
        Element suites = d.getDocumentElement();
        assertEquals("testsuites", suites.getTagName());
        NodeList suiteList = suites.getElementsByTagName("testsuite");
        assertEquals(1, suiteList.getLength());
        Element suite = (Element) suiteList.item(0);
        assertEquals("lvrt_dip_50pct", suite.getAttribute("name"));
        assertEquals("3", suite.getAttribute("tests")); // 2 checks + run_integrity
        assertEquals("1", suite.getAttribute("failures"));
        assertEquals("0", suite.getAttribute("errors"));
        assertEquals("2026-12-02T09:30:00", suite.getAttribute("timestamp"));
        NodeList cases = suite.getElementsByTagName("testcase");
        assertEquals(3, cases.getLength());
        assertEquals("dc_link_stays_in_band", ((Element) cases.item(0)).getAttribute("name"));
        assertEquals(0, ((Element) cases.item(0)).getElementsByTagName("failure").getLength());
        Element failure = (Element) ((Element) cases.item(1)).getElementsByTagName("failure").item(0);
        assertEquals("measured 41.5 ms, required <= 30 ms", failure.getAttribute("message"));
        assertEquals("rise_time", failure.getAttribute("type"));
        assertEquals("Reactive current reached 90 % of its step 11.5 ms late <&> \"quoted\"", failure.getTextContent());
        assertEquals(JunitXml.RUN_INTEGRITY, ((Element) cases.item(2)).getAttribute("name"));
        assertEquals(0, ((Element) cases.item(2)).getChildNodes().getLength());
    }

    @Test
    void shouldReportAnAbortedRunAsAnErrorAndDroppedSamplesAsAFailure(@TempDir Path dir) throws Exception {
        Path aborted = JunitXml.write(dir.resolve("a.xml"), List.of(
                RunInputs.failing().abortedReason("board fell silent: link watchdog after 20 ms").build(),
                RunInputs.failing().passed(false).checks(List.of(RunInputs.passedDcBand())).samplesDropped(12).build()));
        Document d = validateAndParse(aborted);
        NodeList suites = d.getElementsByTagName("testsuite");
        assertEquals(2, suites.getLength());
        Element first = (Element) suites.item(0);
        assertEquals("1", first.getAttribute("errors"));
        Element error = (Element) first.getElementsByTagName("error").item(0);
        assertEquals("run aborted: board fell silent: link watchdog after 20 ms", error.getAttribute("message"));
        Element second = (Element) suites.item(1);
        assertEquals("1", second.getAttribute("failures"));
        Element drop = (Element) second.getElementsByTagName("failure").item(0);
        assertEquals("measured 12 samples dropped, required 0", drop.getAttribute("message"));
        assertEquals("2", d.getDocumentElement().getAttribute("failures"));
        assertEquals("1", d.getDocumentElement().getAttribute("errors"));
        assertEquals("5", d.getDocumentElement().getAttribute("tests"));
    }

    @Test
    void shouldStayValidWithControlCharactersInNames(@TempDir Path dir) throws Exception {
        Path file = JunitXml.write(dir, RunInputs.failing().environment(java.util.Map.of("host", "a\u0001b")).build());
        Document d = validateAndParse(file);
        assertEquals("ab", ((Element) d.getElementsByTagName("testsuite").item(0)).getAttribute("hostname"));
    }

    @Test
    void shouldHaveASchemaThatRejectsASuiteWithoutItsRequiredCounts(@TempDir Path dir) throws Exception {
        // the validation in the tests above can fail: a file missing required attributes is refused
        Path bad = dir.resolve("bad.xml");
        Files.writeString(bad, "<testsuites><testsuite name=\"x\"><testcase name=\"c\"/></testsuite></testsuites>");
        assertThrows(SAXException.class, () -> schema().newValidator().validate(new StreamSource(bad.toFile())));
    }
}
