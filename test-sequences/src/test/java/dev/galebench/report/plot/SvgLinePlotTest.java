package dev.galebench.report.plot;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

import javax.xml.parsers.DocumentBuilderFactory;
import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class SvgLinePlotTest {
    static Document parse(Path file) throws Exception {
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        return f.newDocumentBuilder().parse(file.toFile());
    }

    static double[] ramp(int n, double step) {
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = i * step;
        }
        return x;
    }

    @Test
    void shouldWriteAWellFormedStandAloneSvgWithSeriesBandMarkersAndAxisUnits(@TempDir Path dir) throws Exception {
        int n = 100_000;
        double[] t = ramp(n, 1e-4);
        double[] a = new double[n];
        double[] b = new double[n];
        for (int i = 0; i < n; i++) {
            a[i] = Math.sin(2 * Math.PI * 5 * t[i]);
            b[i] = i == 71_234 ? 7.5 : 0.5 * Math.cos(2 * Math.PI * 5 * t[i]);
        }
        SvgLinePlot p = new SvgLinePlot(900, 300).id("cmp").title("golden vs board <run 7>").xAxis("plant time", "s")
                .yAxis("reactive current", "pu").addSeries("golden", t, a).addSeries("board", t, b)
                .addBand(2.0, 4.0, -0.9, 0.9, "band").addMarker(2.0, "dip").addMarker(4.0, "clear");
        assertTrue(p.pointCount(0) <= 2000 && p.pointCount(1) <= 2000, "decimated to ~2000 points");
        Path file = dir.resolve("cmp.svg");
        p.writeTo(file);
        Document d = parse(file);
        Element svg = d.getDocumentElement();
        assertEquals("svg", svg.getLocalName());
        assertEquals("http://www.w3.org/2000/svg", svg.getNamespaceURI());
        assertEquals(1, svg.getElementsByTagName("style").getLength(), "stand-alone file carries its style");
        NodeList paths = svg.getElementsByTagName("path");
        assertEquals(2, paths.getLength());
        assertEquals(SvgLinePlot.PALETTE[0], ((Element) paths.item(0)).getAttribute("stroke"));
        assertEquals(SvgLinePlot.PALETTE[1], ((Element) paths.item(1)).getAttribute("stroke"));
        assertEquals(2, count(svg, "line", "gb-marker"));
        assertEquals(2, count(svg, "line", "gb-band-limit"));
        String text = svg.getTextContent();
        assertTrue(text.contains("golden vs board <run 7>"), "title escaped and kept");
        assertTrue(text.contains("plant time [s]"));
        assertTrue(text.contains("reactive current [pu]"));
        assertTrue(text.contains("dip") && text.contains("clear"));
        // the spike of series b survived decimation: the y axis reaches 7.5
        assertTrue(text.contains("7"), "y ticks cover the spike");
    }

    @Test
    void shouldSplitTheLineAtMissingSamples() {
        double[] x = {0, 1, 2, 3, 4};
        double[] y = {0, 1, Double.NaN, 3, 4};
        String svg = new SvgLinePlot(300, 200).addSeries("s", x, y).toSvgElement();
        String d = svg.substring(svg.indexOf(" d=\"") + 4);
        d = d.substring(0, d.indexOf('"'));
        assertEquals(2, d.chars().filter(c -> c == 'M').count(), d);
        assertEquals(2, d.chars().filter(c -> c == 'L').count(), d);
    }

    @Test
    void shouldDrawLogLogBarsWithDecadeTicks() {
        SvgLinePlot p = new SvgLinePlot(360, 220).logX(true).logY(true).xAxis("time", "µs").yAxis("count", "")
                .addBars("h", new double[] {1, 2, 4}, new double[] {2, 4, 8}, new double[] {5, 500, 0});
        String svg = p.toSvgElement();
        assertEquals(2, svg.split("class=\"gb-bar\"", -1).length - 1, "zero-count bar not drawn");
        assertTrue(svg.contains(">1<") && svg.contains(">10<"), "decade ticks");
        assertFalse(svg.contains("NaN") || svg.contains("Infinity"));
    }

    @Test
    void shouldFormatTicksWithSiSuffixesAndNiceSteps() {
        assertEquals(2.0, SvgLinePlot.niceStep(1.7));
        assertEquals(5e-3, SvgLinePlot.niceStep(4.1e-3), 1e-15);
        assertEquals(10.0, SvgLinePlot.niceStep(8.0));
        assertEquals("3.5M", SvgLinePlot.formatTick(3.5e6, 5e5, 4e6));
        assertEquals("0.25", SvgLinePlot.formatTick(0.25, 0.05, 1));
        assertEquals("0.0", SvgLinePlot.formatTick(-1e-17, 0.5, 1)); // never "-0.0"
        assertEquals("-20k", SvgLinePlot.formatTick(-2e4, 1e4, 3e4));
        assertEquals(2500.0, SvgLinePlot.niceStep(3000.0));
        assertEquals("7.5k", SvgLinePlot.formatTick(7500, 2500, 12000));
        assertEquals("0.3", SvgLinePlot.formatTick(0.30000000000000004, 0.1, 1));
        assertThrows(IllegalArgumentException.class, () -> new SvgLinePlot(10, 10));
    }

    @Test
    void shouldKeepExtremesInTimeOrderWhenDecimating() {
        double[] x = ramp(1000, 1);
        double[] y = new double[1000];
        y[10] = -5;
        y[500] = 9;
        MinMaxDecimation.Points p = MinMaxDecimation.decimate(x, y, 20);
        assertTrue(p.x().length <= 20);
        double min = 0;
        double max = 0;
        for (int i = 0; i < p.y().length; i++) {
            min = Math.min(min, p.y()[i]);
            max = Math.max(max, p.y()[i]);
            if (i > 0) {
                assertTrue(p.x()[i] > p.x()[i - 1]);
            }
        }
        assertEquals(-5, min);
        assertEquals(9, max);
    }

    private static int count(Element root, String tag, String cls) {
        NodeList l = root.getElementsByTagName(tag);
        int n = 0;
        for (int i = 0; i < l.getLength(); i++) {
            if (cls.equals(((Element) l.item(i)).getAttribute("class"))) {
                n++;
            }
        }
        return n;
    }
}
