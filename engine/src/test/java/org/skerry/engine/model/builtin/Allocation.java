package org.skerry.engine.model.builtin;

import java.lang.management.ManagementFactory;
import org.skerry.engine.model.Model;

/**
 * Measures the bytes the current thread allocates over many likelihood calls, with HotSpot's
 * {@code com.sun.management.ThreadMXBean}; −1 where the JVM does not offer the count.
 */
final class Allocation {

    private Allocation() {
    }

    static long bytesPerMillionCalls(Model model, double[][] points) {
        java.lang.management.ThreadMXBean bean = ManagementFactory.getThreadMXBean();
        if (!(bean instanceof com.sun.management.ThreadMXBean)) {
            return -1;
        }
        com.sun.management.ThreadMXBean hotspot = (com.sun.management.ThreadMXBean) bean;
        if (!hotspot.isThreadAllocatedMemorySupported() || !hotspot.isThreadAllocatedMemoryEnabled()) {
            return -1;
        }
        double sink = 0.0;
        for (int i = 0; i < 20_000; i++) {
            sink += model.logLikelihood(points[i % points.length], null);
        }
        long thread = Thread.currentThread().getId();
        long before = hotspot.getThreadAllocatedBytes(thread);
        for (int i = 0; i < 1_000_000; i++) {
            sink += model.logLikelihood(points[i % points.length], null);
        }
        long after = hotspot.getThreadAllocatedBytes(thread);
        if (Double.isNaN(sink)) {
            throw new AssertionError("NaN log-likelihood");
        }
        return after - before;
    }
}
