package org.skerry.cli;

import picocli.CommandLine.IVersionProvider;

/** The program version, from the jar manifest (or "development" when run from classes). */
public final class Version implements IVersionProvider {

    /** The version string. */
    public static String text() {
        String version = Version.class.getPackage().getImplementationVersion();
        return version == null ? "development" : version;
    }

    @Override
    public String[] getVersion() {
        return new String[] {"skerry " + text(), "Java " + System.getProperty("java.version") + " ("
                + System.getProperty("java.vendor") + ")"};
    }
}
