package dev.galebench.report;

import java.lang.management.ManagementFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The environment block of a run report: what a reviewer needs to judge timing numbers (JVM,
 * its flags, CPU, OS, host). Captured once, off the real-time thread; the runner adds its own
 * entries (link, board, galebench version) to the returned map before building the report input.
 */
public final class RunEnvironment {
    private RunEnvironment() {
    }

    /** jvm, jvm_flags, cpu, cpu_count, os, host, java_home, in this order. */
    public static Map<String, String> capture() {
        Map<String, String> env = new LinkedHashMap<>();
        env.put("jvm", System.getProperty("java.vm.name", "?") + " " + System.getProperty("java.runtime.version", System.getProperty("java.version", "?")));
        env.put("jvm_flags", String.join(" ", ManagementFactory.getRuntimeMXBean().getInputArguments()));
        env.put("cpu", cpuModel());
        env.put("cpu_count", Integer.toString(Runtime.getRuntime().availableProcessors()));
        env.put("os", System.getProperty("os.name", "?") + " " + System.getProperty("os.version", "") + " " + System.getProperty("os.arch", ""));
        env.put("host", hostName());
        env.put("java_home", System.getProperty("java.home", "?"));
        return env;
    }

    private static String cpuModel() {
        Path info = Path.of("/proc/cpuinfo");
        try {
            if (Files.isReadable(info)) {
                List<String> lines = Files.readAllLines(info);
                for (String l : lines) {
                    if (l.startsWith("model name")) {
                        return l.substring(l.indexOf(':') + 1).trim();
                    }
                }
            }
        } catch (Exception e) {
            return "unknown (" + e.getClass().getSimpleName() + ")";
        }
        return System.getProperty("os.arch", "unknown");
    }

    /** From /etc/hostname or $HOSTNAME: no name lookup, so capturing never touches the network. */
    private static String hostName() {
        try {
            Path p = Path.of("/etc/hostname");
            if (Files.isReadable(p)) {
                String h = Files.readString(p).trim();
                if (!h.isEmpty()) {
                    return h;
                }
            }
        } catch (Exception e) {
            // fall through to the environment variable
        }
        String h = System.getenv("HOSTNAME");
        return h == null || h.isBlank() ? "localhost" : h;
    }
}
