/**
 * Prints the JVM options Spark needs on Java 17 (module opens for Kryo, Netty and off-heap
 * memory), one a line. Run with the source launcher, {@code java -cp 'lib/*' ModuleOptions.java},
 * so that the list always comes from the Spark version on the class path instead of a copy that
 * goes stale when Spark is upgraded.
 */
public final class ModuleOptions {
  private ModuleOptions() {
  }

  public static void main(String[] args) {
    for (String option : org.apache.spark.launcher.JavaModuleOptions.defaultModuleOptionArray()) {
      System.out.println(option);
    }
  }
}
