package dev.galebench.testsupport;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * Runs {@link DemoRun}'s end-of-run reports in a separate JVM with a small, fixed heap, to show
 * that writing report.html from a long recording needs memory independent of its length.
 */
public final class ReportInChildJvm {
    private ReportInChildJvm() {
    }

    /** Entry point of the child: args = run folder, plant seconds. */
    public static void main(String[] args) throws Exception {
        dev.galebench.report.RunReports.writeAll(Path.of(args[0]), DemoRun.input(Double.parseDouble(args[1])).build());
    }

    /** Writes the reports of {@code dir} in a child JVM limited to {@code heapMb}; returns its exit code and output. */
    public static Result run(Path dir, double seconds, int heapMb) throws Exception {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder(List.of(java, "-Xmx" + heapMb + "m", "-Xms" + heapMb + "m", "-XX:+UseSerialGC",
                "-cp", System.getProperty("java.class.path"), ReportInChildJvm.class.getName(), dir.toString(),
                Double.toString(seconds)));
        pb.redirectErrorStream(true);
        pb.redirectOutput(dir.resolve("child.log").toFile());
        Process p = pb.start();
        if (!p.waitFor(300, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            return new Result(-1, "child JVM timed out");
        }
        return new Result(p.exitValue(), Files.readString(dir.resolve("child.log")));
    }

    public record Result(int exitCode, String output) {
    }
}
