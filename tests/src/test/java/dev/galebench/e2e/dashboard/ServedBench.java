package dev.galebench.e2e.dashboard;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.TimeUnit;

/**
 * {@code galebench serve} as its own JVM process (the test's classpath, the project's JVM
 * flags), so the browser talks to a bench exactly as a user's would. Its console output is
 * collected; {@link #close()} stops it like Ctrl-C (SIGTERM, then the shutdown hook closes the
 * loop and the server) and kills it only if it does not stop in time.
 */
final class ServedBench implements AutoCloseable {
    private final Process process;
    private final List<String> output = new CopyOnWriteArrayList<>();
    private final int port;
    private final Path runs;

    ServedBench(Path runs, String... extraArgs) throws IOException, InterruptedException {
        this.runs = runs;
        Files.createDirectories(runs);
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort();
        }
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-Xms512m", "-Xmx1g", "-XX:+UseParallelGC", "-da:com.lmax.disruptor...",
                "-cp", System.getProperty("java.class.path"),
                "dev.galebench.cli.GalebenchCommand", "serve", "--port", String.valueOf(port),
                "--runs", runs.toString(), "--seconds", "600"));
        cmd.addAll(List.of(extraArgs));
        process = new ProcessBuilder(cmd).redirectErrorStream(true).start();
        Thread reader = new Thread(() -> {
            try (BufferedReader r = new BufferedReader(new InputStreamReader(process.getInputStream(), StandardCharsets.UTF_8))) {
                String line;
                while ((line = r.readLine()) != null) {
                    output.add(line);
                }
            } catch (IOException ignored) {
                // process ended
            }
        }, "serve-output");
        reader.setDaemon(true);
        reader.start();
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (output.stream().noneMatch(l -> l.contains("live console at"))) {
            if (!process.isAlive() || System.nanoTime() > deadline) {
                throw new IllegalStateException("galebench serve did not start: " + String.join("\n", output));
            }
            Thread.sleep(50);
        }
    }

    String url() {
        return "http://127.0.0.1:" + port + "/";
    }

    Path runs() {
        return runs;
    }

    List<String> output() {
        return output;
    }

    /** Stops the bench; returns its exit code. */
    int stop() throws InterruptedException {
        process.destroy();
        if (!process.waitFor(30, TimeUnit.SECONDS)) {
            process.destroyForcibly();
            process.waitFor(10, TimeUnit.SECONDS);
        }
        return process.exitValue();
    }

    @Override
    public void close() {
        if (process.isAlive()) {
            try {
                stop();
            } catch (InterruptedException e) {
                process.destroyForcibly();
                Thread.currentThread().interrupt();
            }
        }
    }
}
