package org.skerry.benchmarks;

import com.sun.management.GarbageCollectionNotificationInfo;
import java.lang.management.GarbageCollectorMXBean;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryUsage;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicLong;
import javax.management.Notification;
import javax.management.NotificationEmitter;
import javax.management.NotificationListener;
import javax.management.openmbean.CompositeData;

/**
 * Watches this JVM's heap two ways. Sampled "used" heap (every few milliseconds) includes garbage
 * not yet collected, so it mostly shows how full the collector lets the heap get. The heap in use
 * right after each collection is the live data plus what the collector chose not to clean (young
 * collections leave the old generation alone), which is the honest upper bound on what the program
 * holds; its maximum over the run is what {@link #peakAfterGc()} reports.
 */
final class HeapWatch implements AutoCloseable {

    private final AtomicLong peakSampled = new AtomicLong();
    private final AtomicLong peakAfterGc = new AtomicLong();
    private final AtomicLong collections = new AtomicLong();
    private final List<NotificationEmitter> emitters = new ArrayList<>();
    private final NotificationListener listener = this::onCollection;
    private final Thread sampler;
    private volatile boolean running = true;

    HeapWatch(long periodMillis) {
        for (GarbageCollectorMXBean bean : ManagementFactory.getGarbageCollectorMXBeans()) {
            if (bean instanceof NotificationEmitter emitter) {
                emitter.addNotificationListener(listener, null, null);
                emitters.add(emitter);
            }
        }
        sampler = new Thread(() -> {
            while (running) {
                long used = ManagementFactory.getMemoryMXBean().getHeapMemoryUsage().getUsed();
                peakSampled.accumulateAndGet(used, Math::max);
                try {
                    Thread.sleep(periodMillis);
                } catch (InterruptedException e) {
                    return;
                }
            }
        }, "heap-watch");
        sampler.setDaemon(true);
        sampler.start();
    }

    private void onCollection(Notification notification, Object handback) {
        if (!GarbageCollectionNotificationInfo.GARBAGE_COLLECTION_NOTIFICATION.equals(notification.getType())) {
            return;
        }
        GarbageCollectionNotificationInfo info =
                GarbageCollectionNotificationInfo.from((CompositeData) notification.getUserData());
        long used = 0;
        for (MemoryUsage pool : info.getGcInfo().getMemoryUsageAfterGc().values()) {
            used += pool.getUsed();
        }
        // Non-heap pools (metaspace, code cache) are in the map too; drop them by subtracting the
        // non-heap usage now, which barely moves during a run.
        used -= ManagementFactory.getMemoryMXBean().getNonHeapMemoryUsage().getUsed();
        peakAfterGc.accumulateAndGet(used, Math::max);
        collections.incrementAndGet();
    }

    long peakSampled() {
        return peakSampled.get();
    }

    long peakAfterGc() {
        return peakAfterGc.get();
    }

    long collections() {
        return collections.get();
    }

    @Override
    public void close() {
        running = false;
        sampler.interrupt();
        for (NotificationEmitter emitter : emitters) {
            try {
                emitter.removeNotificationListener(listener);
            } catch (javax.management.ListenerNotFoundException e) {
                // already gone
            }
        }
    }
}
