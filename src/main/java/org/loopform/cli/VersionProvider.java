package org.loopform.cli;

import picocli.CommandLine.IVersionProvider;

/** The version from the jar's manifest, or "development" when run from classes. */
final class VersionProvider implements IVersionProvider {
    /** The version alone ("0.1.0", or "0.1.0 (development build)" when run from classes). */
    static String version() {
        String v = Main.class.getPackage().getImplementationVersion();
        return v != null ? v : "0.1.0 (development build)";
    }

    @Override
    public String[] getVersion() {
        return new String[] {"loopform " + version(),
                "Java " + System.getProperty("java.version")};
    }
}
