package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.skerry.cli.runfile.SparkMasters;

/** The Spark master URLs a run file may name, and which of them run in this process. */
class SparkMastersTest {

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "local|true|true", "local[*]|true|true", "local[4]|true|true", "local[4,2]|true|true", "local[*, 3]|true|true",
        "local-cluster[2,1,1024]|true|false", "local-cluster[ 2 , 1 , 1024 ]|true|false",
        "spark://127.0.0.1:7077|true|false", "spark://master.example.org:7077,backup.example.org:7078|true|false",
        "spark://[::1]:7077|true|false", "yarn|true|false", "k8s://https://10.0.0.1:6443|true|false",
        "foo://bar|false|false", "local[0]|false|false", "local[two]|false|false", "local[ 2]|false|false",
        "spark://host|false|false", "spark://host:0|false|false", "spark://host:70777|false|false",
        "spark://host:7077,|false|false", "YARN|false|false", "k8s://|false|false", "localhost|false|false",
        "' local'|false|false"})
    void forms(String master, boolean valid, boolean inProcess) {
        assertEquals(valid, SparkMasters.isValid(master), master);
        assertEquals(inProcess, SparkMasters.isInProcess(master), master);
    }
}
