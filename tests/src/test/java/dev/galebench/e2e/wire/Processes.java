package dev.galebench.e2e.wire;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** A child process whose first stdout line announces where it listens; stopped by its own handle. */
final class Processes {
    private Processes() {
    }

    /** A started process plus the first line it printed and the rest of its stderr once stopped. */
    static final class Child implements AutoCloseable {
        final Process process;
        final String firstLine;
        private final StringBuilder err = new StringBuilder();
        private final Thread errReader;

        Child(List<String> command) throws IOException {
            process = new ProcessBuilder(command).start();
            errReader = new Thread(() -> {
                try (BufferedReader r = new BufferedReader(new InputStreamReader(process.getErrorStream(), StandardCharsets.UTF_8))) {
                    String line;
                    while ((line = r.readLine()) != null) {
                        synchronized (err) {
                            err.append(line).append('\n');
                        }
                    }
                } catch (IOException ignored) {
                    // ended
                }
            }, "child-stderr");
            errReader.setDaemon(true);
            errReader.start();
            final BufferedReader out = new BufferedReader(new InputStreamReader(process.getInputStream(), StandardCharsets.UTF_8));
            firstLine = out.readLine();
            if (firstLine == null) {
                process.destroy();
                throw new IOException("child " + command + " printed nothing; stderr: " + stderr());
            }
        }

        /** The first integer group of {@code regex} in the first line. */
        int parse(String regex) {
            final Matcher m = Pattern.compile(regex).matcher(firstLine);
            if (!m.find()) {
                throw new IllegalStateException("'" + firstLine + "' does not match " + regex);
            }
            return Integer.parseInt(m.group(1));
        }

        /**
         * Sends SIGTERM, waits for the exit, returns the exit code. Through the process handle:
         * {@code Process.destroy()} would also close our end of its stderr pipe and lose its last words.
         */
        int stop() throws InterruptedException {
            process.toHandle().destroy();
            if (!process.waitFor(10, TimeUnit.SECONDS)) {
                process.destroyForcibly();
                process.waitFor(10, TimeUnit.SECONDS);
            }
            errReader.join(5000);
            return process.exitValue();
        }

        String stderr() {
            synchronized (err) {
                return err.toString();
            }
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
}
