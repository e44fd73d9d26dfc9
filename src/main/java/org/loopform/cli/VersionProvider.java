package org.loopform.cli;

import picocli.CommandLine.IVersionProvider;

/** The version from the jar's manifest, or "development" when run from classes. */
final class VersionProvider implements IVersionProvider {
    @Override
    public String[] getVersion() {
        String v = Main.class.getPackage().getImplementationVersion();
        return new String[] {"loopform " + (v != null ? v : "0.1.0 (development build)"),
                "Java " + System.getProperty("java.version")};
    }
}
