package org.loopform.cli;

import picocli.CommandLine.Option;

/** The shared {@code --format text|json} option. */
final class FormatOption {
    @Option(names = "--format", paramLabel = "text|json", defaultValue = "text",
            description = "Output format: text for people, json for tools (default: ${DEFAULT-VALUE}).")
    OutputFormat format = OutputFormat.text;
}
