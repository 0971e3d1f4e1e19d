package dev.galebench.report;

import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

class RunEnvironmentTest {
    @Test
    void shouldCaptureJvmFlagsCpuAndHostInAFixedOrder() {
        Map<String, String> env = RunEnvironment.capture();
        assertEquals(List.of("jvm", "jvm_flags", "cpu", "cpu_count", "os", "host", "java_home"), List.copyOf(env.keySet()));
        assertTrue(env.get("jvm").contains(System.getProperty("java.version").split("\\.")[0]), env.get("jvm"));
        // surefire starts this JVM with the project's test flags (root pom galebench.test.jvm)
        assertTrue(env.get("jvm_flags").contains("-Xmx1g"), env.get("jvm_flags"));
        assertEquals(Integer.toString(Runtime.getRuntime().availableProcessors()), env.get("cpu_count"));
        assertFalse(env.get("host").isBlank());
    }
}
