package org.skerry.cli.runfile;

import java.util.regex.Pattern;

/**
 * The Spark master URLs a run file may name, checked when the run file is read (so
 * {@code skerry validate} catches a typo that Spark itself would only report, with a stack
 * trace, once the run had started): {@code local}, {@code local[N]}, {@code local[*]} (also
 * with a task-failure count, {@code local[N,F]}), {@code local-cluster[W,C,M]},
 * {@code spark://host:port} (several masters: {@code spark://h1:p1,h2:p2}), {@code yarn} and
 * {@code k8s://…}.
 */
public final class SparkMasters {

    /** The accepted forms, for messages. */
    public static final String FORMS = "local, local[N], local[*], local-cluster[W,C,M], spark://host:port "
            + "(several: spark://host1:port1,host2:port2), yarn or k8s://…";

    private static final Pattern LOCAL = Pattern.compile("local(\\[(\\*|[1-9]\\d*)(\\s*,\\s*[1-9]\\d*)?\\])?");
    private static final Pattern LOCAL_CLUSTER =
            Pattern.compile("local-cluster\\[\\s*[1-9]\\d*\\s*,\\s*[1-9]\\d*\\s*,\\s*[1-9]\\d*\\s*\\]");
    private static final String HOST = "([A-Za-z0-9]([A-Za-z0-9-]*[A-Za-z0-9])?(\\.[A-Za-z0-9]([A-Za-z0-9-]*[A-Za-z0-9])?)*"
            + "|\\[[0-9A-Fa-f:.]+\\])";
    private static final String PORT = "([1-9]\\d{0,3}|[1-5]\\d{4}|6[0-4]\\d{3}|65[0-4]\\d{2}|655[0-2]\\d|6553[0-5])";
    private static final Pattern STANDALONE = Pattern.compile("spark://" + HOST + ":" + PORT + "(," + HOST + ":" + PORT + ")*");
    private static final Pattern KUBERNETES = Pattern.compile("k8s://\\S+");

    private SparkMasters() {
    }

    /** Whether Spark accepts {@code master} as one of the forms above. */
    public static boolean isValid(String master) {
        return LOCAL.matcher(master).matches() || LOCAL_CLUSTER.matcher(master).matches()
                || STANDALONE.matcher(master).matches() || master.equals("yarn") || KUBERNETES.matcher(master).matches();
    }

    /**
     * Cores of each executor where the master says it: {@code local[N]} (N), {@code local[*]}
     * (this machine's processors), {@code local} (1), {@code local-cluster[W,C,M]} (C); 0 for a
     * cluster master, whose executors' cores only the cluster knows.
     */
    public static int coresPerExecutor(String master) {
        java.util.regex.Matcher local = LOCAL.matcher(master);
        if (local.matches()) {
            String cores = local.group(2);
            return cores == null ? 1 : cores.equals("*") ? Runtime.getRuntime().availableProcessors()
                    : Integer.parseInt(cores);
        }
        if (LOCAL_CLUSTER.matcher(master).matches()) {
            return Integer.parseInt(master.replaceAll("\\s", "").split("[\\[,\\]]")[2]);
        }
        return 0;
    }

    /**
     * Whether {@code master} runs everything in this process (local mode): executors share the
     * driver's class path and disk. {@code local-cluster[…]} does not: its executors are JVMs of
     * their own.
     */
    public static boolean isInProcess(String master) {
        return LOCAL.matcher(master).matches();
    }
}
