package org.loopform.cli;

/** How a command prints its result. */
enum OutputFormat {
    text, json
}
