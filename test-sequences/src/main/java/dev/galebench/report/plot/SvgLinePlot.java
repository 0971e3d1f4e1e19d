package dev.galebench.report.plot;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Draws an x-y plot as self-contained SVG: line series (min/max-decimated to at most
 * {@link #maxPointsPerSeries} points each), bar series (for histograms), shaded bands with
 * their limits (a check's tolerance band over its window), vertical markers (a check's
 * window, an event), linear or logarithmic axes with units and "nice" ticks, and a legend.
 *
 * <p>Used by the HTML report (inline, {@link #toSvgElement()}) and by back-to-back comparisons
 * (stand-alone files, {@link #writeTo(Path)}, which embed their own style). No script and no
 * external resource: the SVG renders from disk in any browser.
 *
 * <p>Cost: proportional to the points drawn, not to the length of the recording: feed it
 * {@link dev.galebench.report.comtrade.DecimatedTraces} or {@link MinMaxDecimation} output.
 */
public final class SvgLinePlot {
    /** Colours of successive series (colour-blind-safe order). */
    static final String[] PALETTE = {"#2563eb", "#ea580c", "#059669", "#9333ea", "#dc2626", "#0891b2", "#ca8a04", "#4b5563"};

    private record Series(String name, double[] x, double[] y, boolean bars, double[] xRight, String color) {
    }

    private record Band(double xFrom, double xTo, double yLow, double yHigh, String label) {
    }

    private record Marker(double x, String label) {
    }

    private final int widthPx;
    private final int heightPx;
    private String id = "plot";
    private String title = "";
    private String xLabel = "time";
    private String xUnit = "s";
    private String yLabel = "";
    private String yUnit = "";
    private boolean logX;
    private boolean logY;
    private int maxPointsPerSeries = 2000;
    private double xMin = Double.NaN;
    private double xMax = Double.NaN;
    private final List<Series> series = new ArrayList<>();
    private final List<Band> bands = new ArrayList<>();
    private final List<Marker> markers = new ArrayList<>();

    public SvgLinePlot(int widthPx, int heightPx) {
        if (widthPx < 160 || heightPx < 100) {
            throw new IllegalArgumentException("plot needs at least 160 x 100 px, got " + widthPx + " x " + heightPx);
        }
        this.widthPx = widthPx;
        this.heightPx = heightPx;
    }

    /** Element id prefix; must be unique within one HTML page (used for the clip path). */
    public SvgLinePlot id(String v) { id = v.replaceAll("[^A-Za-z0-9_-]", "_"); return this; }
    public SvgLinePlot title(String v) { title = v; return this; }
    public SvgLinePlot xAxis(String label, String unit) { xLabel = label; xUnit = unit; return this; }
    public SvgLinePlot yAxis(String label, String unit) { yLabel = label; yUnit = unit; return this; }
    public SvgLinePlot logX(boolean v) { logX = v; return this; }
    public SvgLinePlot logY(boolean v) { logY = v; return this; }
    /** Fixes the x range instead of fitting the data (e.g. a zoom on a check window). */
    public SvgLinePlot xRange(double min, double max) { xMin = min; xMax = max; return this; }
    public SvgLinePlot maxPointsPerSeries(int v) { maxPointsPerSeries = Math.max(4, v); return this; }

    /** A line series; more points than {@link #maxPointsPerSeries} are min/max-decimated. */
    public SvgLinePlot addSeries(String name, double[] x, double[] y) {
        MinMaxDecimation.Points p = MinMaxDecimation.decimate(x, y, maxPointsPerSeries);
        series.add(new Series(name, p.x(), p.y(), false, null, PALETTE[series.size() % PALETTE.length]));
        return this;
    }

    /** A bar series: bar i spans {@code xLeft[i]..xRight[i]} with height {@code height[i]}. */
    public SvgLinePlot addBars(String name, double[] xLeft, double[] xRight, double[] height) {
        series.add(new Series(name, xLeft.clone(), height.clone(), true, xRight.clone(), PALETTE[series.size() % PALETTE.length]));
        return this;
    }

    /** A shaded band {@code yLow..yHigh} over {@code xFrom..xTo}; NaN limits extend to the plot edge. */
    public SvgLinePlot addBand(double xFrom, double xTo, double yLow, double yHigh, String label) {
        bands.add(new Band(xFrom, xTo, yLow, yHigh, label));
        return this;
    }

    /** A vertical dashed line at {@code x} with a label at its top. */
    public SvgLinePlot addMarker(double x, String label) {
        if (Double.isFinite(x)) {
            markers.add(new Marker(x, label));
        }
        return this;
    }

    /** Number of points drawn for series {@code i} (after decimation). */
    public int pointCount(int i) {
        return series.get(i).x().length;
    }

    /** Writes a stand-alone {@code .svg} file (with its own style). */
    public void writeTo(Path file) throws IOException {
        Files.writeString(file, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" + render(true), StandardCharsets.UTF_8);
    }

    /** The {@code <svg>} element for inlining into an HTML page whose CSS includes {@code plot.css}. */
    public String toSvgElement() {
        return render(false);
    }

    // ---- rendering ----

    private static final int LEFT = 68;
    private static final int RIGHT = 18;
    private static final int TOP = 30;
    private static final int BOTTOM = 44;

    private String render(boolean standalone) {
        double[] xr = xRangeOfData();
        double[] yr = yRangeOfData(xr);
        Axis ax = new Axis(xr[0], xr[1], logX, LEFT, widthPx - RIGHT);
        Axis ay = new Axis(yr[0], yr[1], logY, heightPx - BOTTOM, TOP);
        SvgWriter w = new SvgWriter();
        w.open("svg", "xmlns", standalone ? "http://www.w3.org/2000/svg" : null, "class", "gb-plot",
                "viewBox", "0 0 " + widthPx + " " + heightPx, "width", Integer.toString(widthPx),
                "height", Integer.toString(heightPx), "role", "img", "aria-label", title);
        if (standalone) {
            w.open("style").text(plotCss()).close("style");
        }
        String clip = id + "-clip";
        w.open("defs").open("clipPath", "id", clip)
                .empty("rect", "x", SvgWriter.num(LEFT), "y", SvgWriter.num(TOP), "width", SvgWriter.num(widthPx - LEFT - RIGHT),
                        "height", SvgWriter.num(heightPx - TOP - BOTTOM))
                .close("clipPath").close("defs");
        w.empty("rect", "class", "gb-frame", "x", SvgWriter.num(LEFT), "y", SvgWriter.num(TOP),
                "width", SvgWriter.num(widthPx - LEFT - RIGHT), "height", SvgWriter.num(heightPx - TOP - BOTTOM));
        drawGridAndTicks(w, ax, ay);
        w.open("g", "clip-path", "url(#" + clip + ")");
        for (Band b : bands) {
            drawBand(w, b, ax, ay);
        }
        for (Series s : series) {
            if (s.bars()) {
                drawBars(w, s, ax, ay);
            } else {
                drawLine(w, s, ax, ay);
            }
        }
        for (Marker m : markers) {
            double px = ax.toPx(m.x());
            w.empty("line", "class", "gb-marker", "x1", SvgWriter.num(px), "x2", SvgWriter.num(px),
                    "y1", SvgWriter.num(TOP), "y2", SvgWriter.num(heightPx - BOTTOM));
        }
        w.close("g");
        int row = 0;
        double lastLabelEnd = Double.NEGATIVE_INFINITY;
        for (Marker m : markers) {
            double px = ax.toPx(m.x());
            if (px >= LEFT && px <= widthPx - RIGHT && m.label() != null && !m.label().isEmpty()) {
                // labels that would overlap the previous one go one line lower
                row = px + 3 < lastLabelEnd ? row + 1 : 0;
                double textWidth = 5.8 * m.label().length();
                double x = Math.min(px + 3, widthPx - RIGHT - textWidth);
                w.textElement("text", m.label(), "class", "gb-marker-label", "x", SvgWriter.num(x), "y", SvgWriter.num(TOP + 11 + 11 * row));
                lastLabelEnd = x + textWidth;
            }
        }
        w.textElement("text", title, "class", "gb-title", "x", SvgWriter.num(LEFT), "y", "18");
        w.textElement("text", axisTitle(xLabel, xUnit), "class", "gb-axis-title", "x", SvgWriter.num((LEFT + widthPx - RIGHT) / 2.0),
                "y", SvgWriter.num(heightPx - 6), "text-anchor", "middle");
        double yMid = (TOP + heightPx - BOTTOM) / 2.0;
        w.textElement("text", axisTitle(yLabel, yUnit), "class", "gb-axis-title", "x", "14", "y", SvgWriter.num(yMid),
                "text-anchor", "middle", "transform", "rotate(-90 14 " + SvgWriter.num(yMid) + ")");
        drawLegend(w);
        w.close("svg");
        return w.toString();
    }

    private static String axisTitle(String label, String unit) {
        if (unit == null || unit.isEmpty()) {
            return label;
        }
        return label + " [" + unit + "]";
    }

    private double[] xRangeOfData() {
        if (Double.isFinite(xMin) && Double.isFinite(xMax) && xMax > xMin) {
            return new double[] {xMin, xMax};
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (Series s : series) {
            for (int i = 0; i < s.x().length; i++) {
                double a = s.x()[i];
                double b = s.bars() ? s.xRight()[i] : a;
                if (usable(a, logX)) {
                    lo = Math.min(lo, a);
                }
                if (usable(b, logX)) {
                    hi = Math.max(hi, b);
                }
            }
        }
        return fixRange(lo, hi, logX);
    }

    private double[] yRangeOfData(double[] xr) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (Series s : series) {
            for (int i = 0; i < s.y().length; i++) {
                double x = s.x()[i];
                double y = s.y()[i];
                if (!s.bars() && (x < xr[0] || x > xr[1])) {
                    continue;
                }
                if (usable(y, logY)) {
                    lo = Math.min(lo, y);
                    hi = Math.max(hi, y);
                }
            }
            if (s.bars() && !logY) {
                lo = Math.min(lo, 0.0);
            }
        }
        for (Band b : bands) {
            if (usable(b.yLow(), logY)) {
                lo = Math.min(lo, b.yLow());
                hi = Math.max(hi, b.yLow());
            }
            if (usable(b.yHigh(), logY)) {
                lo = Math.min(lo, b.yHigh());
                hi = Math.max(hi, b.yHigh());
            }
        }
        double[] r = fixRange(lo, hi, logY);
        if (!logY) {
            double pad = 0.06 * (r[1] - r[0]);
            r[0] -= pad;
            r[1] += pad;
        }
        return r;
    }

    private static boolean usable(double v, boolean log) {
        return Double.isFinite(v) && (!log || v > 0);
    }

    private static double[] fixRange(double lo, double hi, boolean log) {
        if (!(lo <= hi)) {
            return log ? new double[] {1, 10} : new double[] {0, 1};
        }
        if (log) {
            double a = Math.pow(10, Math.floor(Math.log10(lo)));
            double b = Math.pow(10, Math.ceil(Math.log10(hi)));
            return new double[] {a, b > a ? b : a * 10};
        }
        if (hi == lo) {
            double d = lo == 0 ? 1 : Math.abs(lo) * 0.1;
            return new double[] {lo - d, hi + d};
        }
        return new double[] {lo, hi};
    }

    private void drawGridAndTicks(SvgWriter w, Axis ax, Axis ay) {
        for (double t : ax.ticks()) {
            double px = ax.toPx(t);
            w.empty("line", "class", "gb-grid", "x1", SvgWriter.num(px), "x2", SvgWriter.num(px), "y1", SvgWriter.num(TOP),
                    "y2", SvgWriter.num(heightPx - BOTTOM));
            w.textElement("text", ax.label(t), "class", "gb-tick", "x", SvgWriter.num(px), "y", SvgWriter.num(heightPx - BOTTOM + 15),
                    "text-anchor", "middle");
        }
        for (double t : ay.ticks()) {
            double py = ay.toPx(t);
            w.empty("line", "class", "gb-grid", "x1", SvgWriter.num(LEFT), "x2", SvgWriter.num(widthPx - RIGHT),
                    "y1", SvgWriter.num(py), "y2", SvgWriter.num(py));
            w.textElement("text", ay.label(t), "class", "gb-tick", "x", SvgWriter.num(LEFT - 6), "y", SvgWriter.num(py + 4),
                    "text-anchor", "end");
        }
    }

    private void drawBand(SvgWriter w, Band b, Axis ax, Axis ay) {
        double x0 = Double.isFinite(b.xFrom()) ? ax.toPx(b.xFrom()) : LEFT;
        double x1 = Double.isFinite(b.xTo()) ? ax.toPx(b.xTo()) : widthPx - RIGHT;
        double yTop = Double.isFinite(b.yHigh()) ? ay.toPx(b.yHigh()) : TOP;
        double yBottom = Double.isFinite(b.yLow()) ? ay.toPx(b.yLow()) : heightPx - BOTTOM;
        w.open("g", "class", "gb-band");
        if (b.label() != null) {
            w.textElement("title", b.label());
        }
        w.empty("rect", "class", "gb-band-fill", "x", SvgWriter.num(Math.min(x0, x1)), "y", SvgWriter.num(Math.min(yTop, yBottom)),
                "width", SvgWriter.num(Math.abs(x1 - x0)), "height", SvgWriter.num(Math.abs(yBottom - yTop)));
        if (Double.isFinite(b.yHigh())) {
            w.empty("line", "class", "gb-band-limit", "x1", SvgWriter.num(x0), "x2", SvgWriter.num(x1),
                    "y1", SvgWriter.num(yTop), "y2", SvgWriter.num(yTop));
        }
        if (Double.isFinite(b.yLow())) {
            w.empty("line", "class", "gb-band-limit", "x1", SvgWriter.num(x0), "x2", SvgWriter.num(x1),
                    "y1", SvgWriter.num(yBottom), "y2", SvgWriter.num(yBottom));
        }
        w.close("g");
    }

    private void drawLine(SvgWriter w, Series s, Axis ax, Axis ay) {
        StringBuilder d = new StringBuilder(s.x().length * 14);
        boolean penDown = false;
        for (int i = 0; i < s.x().length; i++) {
            double x = s.x()[i];
            double y = s.y()[i];
            if (!usable(x, logX) || !usable(y, logY)) {
                penDown = false;
                continue;
            }
            d.append(penDown ? 'L' : 'M').append(SvgWriter.num(ax.toPx(x))).append(' ').append(SvgWriter.num(ay.toPx(y)));
            penDown = true;
        }
        if (d.length() > 0) {
            w.empty("path", "class", "gb-line", "d", d.toString(), "stroke", s.color());
        }
    }

    private void drawBars(SvgWriter w, Series s, Axis ax, Axis ay) {
        double base = logY ? heightPx - BOTTOM : ay.toPx(0.0);
        for (int i = 0; i < s.x().length; i++) {
            double h = s.y()[i];
            if (!usable(h, logY) || h == 0) {
                continue;
            }
            double x0 = ax.toPx(s.x()[i]);
            double x1 = ax.toPx(s.xRight()[i]);
            double top = ay.toPx(h);
            w.empty("rect", "class", "gb-bar", "x", SvgWriter.num(x0), "y", SvgWriter.num(Math.min(top, base)),
                    "width", SvgWriter.num(Math.max(0.8, x1 - x0 - 0.6)), "height", SvgWriter.num(Math.abs(base - top)),
                    "fill", s.color());
        }
    }

    private void drawLegend(SvgWriter w) {
        if (series.size() < 2) {
            return;
        }
        double x = widthPx - RIGHT;
        for (int i = series.size() - 1; i >= 0; i--) {
            Series s = series.get(i);
            double textWidth = 6.5 * s.name().length();
            x -= textWidth + 22;
            w.empty("rect", "x", SvgWriter.num(x), "y", "10", "width", "12", "height", "4", "fill", s.color());
            w.textElement("text", s.name(), "class", "gb-legend", "x", SvgWriter.num(x + 16), "y", "16");
        }
    }

    static String plotCss() {
        try (InputStream in = SvgLinePlot.class.getResourceAsStream("/dev/galebench/report/plot.css")) {
            if (in == null) {
                throw new IllegalStateException("plot.css missing from the classpath");
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** One axis: data-to-pixel mapping and tick choice. */
    static final class Axis {
        final double min;
        final double max;
        final boolean log;
        final double px0;
        final double px1;

        Axis(double min, double max, boolean log, double px0, double px1) {
            this.min = min;
            this.max = max;
            this.log = log;
            this.px0 = px0;
            this.px1 = px1;
        }

        double toPx(double v) {
            double f = log ? (Math.log10(v) - Math.log10(min)) / (Math.log10(max) - Math.log10(min)) : (v - min) / (max - min);
            return px0 + f * (px1 - px0);
        }

        List<Double> ticks() {
            List<Double> t = new ArrayList<>();
            if (log) {
                int decades = (int) Math.round(Math.log10(max / min));
                int every = Math.max(1, (int) Math.ceil(decades / Math.max(1.0, lengthPx() / 42.0)));
                int i = 0;
                for (double d = min; d <= max * 1.0001; d *= 10) {
                    if (i++ % every == 0) {
                        t.add(d);
                    }
                }
                return t;
            }
            double step = step();
            double first = Math.ceil(min / step) * step;
            for (double v = first; v <= max + step * 1e-9; v += step) {
                t.add(Math.abs(v) < step * 1e-9 ? 0.0 : v);
            }
            return t;
        }

        String label(double v) {
            double scaleMax = Math.max(Math.abs(min), Math.abs(max));
            return formatTick(v, log ? v : step(), log ? v : scaleMax);
        }

        /** About one tick per 60 px (horizontal) or 40 px (vertical), at least 2. */
        double step() {
            double perTick = px1 > px0 ? 70.0 : 38.0;
            return niceStep((max - min) / Math.max(2.0, lengthPx() / perTick));
        }

        double lengthPx() {
            return Math.abs(px1 - px0);
        }
    }

    static double niceStep(double raw) {
        if (!(raw > 0)) {
            return 1;
        }
        double mag = Math.pow(10, Math.floor(Math.log10(raw)));
        double n = raw / mag;
        double m = n < 1.5 ? 1 : n < 2.25 ? 2 : n < 3.5 ? 2.5 : n < 7.5 ? 5 : 10;
        return m * mag;
    }

    /** Tick label: SI suffix (k, M, G) for large scales, just enough decimals for the step. */
    static String formatTick(double v, double step, double scaleMax) {
        String suffix = "";
        double div = 1;
        if (scaleMax >= 1e9) {
            suffix = "G";
            div = 1e9;
        } else if (scaleMax >= 1e6) {
            suffix = "M";
            div = 1e6;
        } else if (scaleMax >= 1e4) {
            suffix = "k";
            div = 1e3;
        }
        double sv = v / div;
        double sstep = step / div;
        // as many decimals as the step needs: 0.25 -> 2, 2.5 -> 1, 500 -> 0
        int decimals = 0;
        while (decimals < 9) {
            double scaled = sstep * Math.pow(10, decimals);
            if (Math.abs(scaled - Math.rint(scaled)) < 1e-6 * Math.max(1.0, scaled)) {
                break;
            }
            decimals++;
        }
        String s = String.format(java.util.Locale.ROOT, "%." + decimals + "f", sv);
        if (s.startsWith("-") && Double.parseDouble(s) == 0) {
            s = s.substring(1);
        }
        return s + suffix;
    }
}
