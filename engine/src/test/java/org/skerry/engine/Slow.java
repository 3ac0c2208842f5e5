package org.skerry.engine;

import java.lang.annotation.Documented;
import java.lang.annotation.ElementType;
import java.lang.annotation.Retention;
import java.lang.annotation.RetentionPolicy;
import java.lang.annotation.Target;
import org.junit.jupiter.api.Tag;

/**
 * Marks a test class or method as slow: JUnit tag {@code slow}, which {@code mvn -Pfast} leaves out
 * and {@code mvn verify} (CI) runs. A test is slow when it starts a process (the program in its own
 * JVM, a standalone cluster, another JDK) or takes over 2 s in the full run's surefire reports; the
 * whole class is marked when all its tests are slow, its set-up is slow, or its other tests still
 * add over 3 s. DEVELOPERS.md, "Build and test", holds the rule and the measurements behind it. One
 * annotation, shared with spark-runner through the engine's test jar, so a misspelt tag does not
 * compile instead of silently joining the fast set.
 */
@Documented
@Retention(RetentionPolicy.RUNTIME)
@Target({ElementType.TYPE, ElementType.METHOD})
@Tag("slow")
public @interface Slow {
}
