package org.loopform.cli;

import org.loopform.report.JsonRenderer;
import org.loopform.report.Renderer;
import org.loopform.report.TextRenderer;

/** How a command prints its result: each format names the renderer that writes it. */
enum OutputFormat {
    text(TextRenderer.INSTANCE), json(JsonRenderer.INSTANCE);

    private final Renderer renderer;

    OutputFormat(Renderer renderer) {
        this.renderer = renderer;
    }

    /** The renderer that writes this format. */
    Renderer renderer() {
        return renderer;
    }
}
