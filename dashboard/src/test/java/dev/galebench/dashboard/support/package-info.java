/**
 * Shared fixtures of the dashboard tests: a WebSocket client over the JDK's
 * {@code java.net.http}, a bench that records what it was asked, and a synthetic sample stream.
 */
package dev.galebench.dashboard.support;
