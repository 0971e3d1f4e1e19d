package dev.galebench.rt;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.BitSet;
import java.util.concurrent.TimeUnit;

/**
 * Pins the calling thread to one CPU on Linux by running {@code taskset -p -c CPU TID} on the
 * thread's own kernel id (read from {@code /proc/thread-self}). Java has no affinity API; this
 * costs a process start (milliseconds) and is done once, on the loop thread, before the first
 * deadline. Pinning only pays off on a core kept free of other work (see rt-plant/LOOP.md:
 * {@code isolcpus}, {@code nohz_full}); on a shared VM it may change nothing.
 */
final class CpuPinning {
    private CpuPinning() {
    }

    /**
     * What {@link #isolate} did, and how to undo it.
     *
     * @param outcome     one line: "other threads on CPUs 1-3" or why not
     * @param restoreList the CPU list to put every thread back on, or null if nothing was moved
     */
    record Isolation(String outcome, String restoreList) {
        /** Puts every thread of this process back on the CPUs it had before (no-op if nothing was moved). */
        void restore() {
            if (restoreList != null) {
                taskset("-a", "-p", "-c", restoreList, Long.toString(ProcessHandle.current().pid()));
            }
        }
    }

    /**
     * Moves every thread of this process (the caller included) to the CPUs it may use now, minus
     * {@code cpu}; threads started afterwards inherit that from their creator. Call before
     * starting the threads of a run, then pin the real-time thread with {@link #pinCurrentThread}.
     */
    static Isolation isolate(int cpu) {
        final String allowed;
        try {
            allowed = allowedList(Files.readAllLines(Path.of("/proc/thread-self/status")));
        } catch (IOException | RuntimeException e) {
            return new Isolation("others not moved: " + e.getMessage(), null);
        }
        if (allowed == null) {
            return new Isolation("others not moved: no Cpus_allowed_list", null);
        }
        final BitSet set = parseList(allowed);
        if (!set.get(cpu)) {
            return new Isolation("other threads already off CPU " + cpu + " (allowed: " + allowed + ")", null);
        }
        set.clear(cpu);
        if (set.isEmpty()) {
            return new Isolation("others not moved: CPU " + cpu + " is the only one allowed", null);
        }
        final String rest = formatList(set);
        final String out = taskset("-a", "-p", "-c", rest, Long.toString(ProcessHandle.current().pid()));
        return out == null ? new Isolation("other threads on CPUs " + rest, allowed)
                : new Isolation("others not moved: " + out, null);
    }

    /** The value of {@code Cpus_allowed_list} in a /proc status file, or null. */
    static String allowedList(Iterable<String> statusLines) {
        for (String line : statusLines) {
            if (line.startsWith("Cpus_allowed_list:")) {
                return line.substring(line.indexOf(':') + 1).trim();
            }
        }
        return null;
    }

    /** Parses a kernel CPU list ("0-2,5,7-8"). */
    static BitSet parseList(String list) {
        final BitSet s = new BitSet();
        for (String part : list.split(",")) {
            final String p = part.trim();
            if (p.isEmpty()) {
                continue;
            }
            final int dash = p.indexOf('-');
            if (dash < 0) {
                s.set(Integer.parseInt(p));
            } else {
                s.set(Integer.parseInt(p.substring(0, dash)), Integer.parseInt(p.substring(dash + 1)) + 1);
            }
        }
        return s;
    }

    /** Formats a CPU set as a kernel CPU list, ranges joined ("0-2,5"). */
    static String formatList(BitSet s) {
        final StringBuilder sb = new StringBuilder();
        for (int i = s.nextSetBit(0); i >= 0; ) {
            final int end = s.nextClearBit(i) - 1;
            if (sb.length() > 0) {
                sb.append(',');
            }
            sb.append(i);
            if (end > i) {
                sb.append('-').append(end);
            }
            i = s.nextSetBit(end + 1);
        }
        return sb.toString();
    }

    /** Runs taskset; null on success, else what went wrong. */
    private static String taskset(String... args) {
        try {
            final String[] cmd = new String[args.length + 1];
            cmd[0] = "taskset";
            System.arraycopy(args, 0, cmd, 1, args.length);
            final Process p = new ProcessBuilder(cmd).redirectErrorStream(true).start();
            final String out = new String(p.getInputStream().readAllBytes()).trim();
            if (!p.waitFor(5, TimeUnit.SECONDS)) {
                p.destroy();
                return "taskset did not finish";
            }
            return p.exitValue() == 0 ? null : "taskset exit " + p.exitValue() + ": " + out;
        } catch (IOException e) {
            return e.getMessage();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return "interrupted";
        }
    }

    /** Pins the current thread; returns a one-line outcome ("pinned to CPU 1" or why not). */
    static String pinCurrentThread(int cpu) {
        try {
            final Path self = Files.readSymbolicLink(Path.of("/proc/thread-self"));
            final String tid = self.getFileName().toString();
            final Process p = new ProcessBuilder("taskset", "-p", "-c", Integer.toString(cpu), tid)
                    .redirectErrorStream(true).start();
            final String out = new String(p.getInputStream().readAllBytes()).trim();
            if (!p.waitFor(5, TimeUnit.SECONDS)) {
                p.destroy();
                return "not pinned: taskset did not finish";
            }
            return p.exitValue() == 0 ? "pinned to CPU " + cpu + " (tid " + tid + ")"
                    : "not pinned: taskset exit " + p.exitValue() + ": " + out;
        } catch (IOException e) {
            return "not pinned: " + e.getMessage();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return "not pinned: interrupted";
        }
    }
}
