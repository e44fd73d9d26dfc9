package org.loopform.report;

/**
 * The report's style sheet, inlined in the page: plain type, thin rules, colour only where it
 * adds to words that say the same thing, and a print layout that keeps tables whole and reads
 * in black and white (design lines dashed, target lines solid).
 */
final class HtmlStyle {
    private HtmlStyle() {
    }

    static final String CSS = """
            :root { --ink: #1d1d1b; --muted: #5a5a55; --rule: #c9c9c2; --paper: #ffffff; --tint: #f4f4ef;
                    --fail: #8b1a1a; --warn: #e3a21a; --pass: #b9d8bd; --bad: #6f6f6a; }
            * { box-sizing: border-box; }
            body { margin: 0 auto; max-width: 1320px; padding: 16px 24px 48px; color: var(--ink);
                   background: var(--paper); font: 14px/1.4 system-ui, "Segoe UI", "DejaVu Sans", Arial, sans-serif; }
            h1 { font-size: 22px; margin: 0 0 6px; }
            h2 { font-size: 17px; margin: 0; }
            h3 { font-size: 14px; margin: 14px 0 6px; }
            a { color: #1f4f8a; }
            .meta { display: grid; grid-template-columns: max-content 1fr; gap: 2px 12px; margin: 8px 0 12px;
                    color: var(--muted); }
            .meta dt { font-weight: 600; color: var(--ink); }
            .meta dd { margin: 0; }
            table.signoff { margin: 6px 0 10px; min-width: 60%; }
            table.signoff td.sign { min-width: 14em; height: 2.2em; border-bottom: 1px solid var(--ink); }
            table.signoff td.sign.date { min-width: 8em; }
            code.fingerprint { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 11.5px;
                               overflow-wrap: anywhere; }
            td.file { overflow-wrap: anywhere; }
            tr.changed th, tr.changed td { font-weight: 700; }
            p.filter input { font: inherit; padding: 2px 6px; min-width: 22em; }
            table.index { width: 100%; font-size: 12px; }
            table.index td, table.index th { padding: 1px 6px; }
            table.index .form { color: var(--muted); }
            table.index tr[hidden] { display: none; }
            .cautions { border: 2px solid var(--ink); padding: 10px 14px; margin: 12px 0 18px; background: var(--tint); }
            .cautions h2 { font-size: 15px; margin-bottom: 4px; }
            .cautions p { margin: 4px 0; font-weight: 600; }
            .cautions ul { margin: 4px 0 0; padding-left: 20px; }
            .cols { display: grid; grid-template-columns: repeat(auto-fit, minmax(400px, 1fr)); gap: 8px 28px;
                    align-items: start; }
            table { border-collapse: collapse; margin: 4px 0 8px; font-size: 13px; }
            caption { text-align: left; font-weight: 600; padding: 2px 0 4px; }
            th, td { border-bottom: 1px solid var(--rule); padding: 2px 8px; text-align: left; vertical-align: top; }
            thead th { border-bottom: 1.5px solid var(--ink); font-weight: 600; white-space: nowrap; }
            thead tr.group th { border-bottom: 1px solid var(--rule); color: var(--muted); font-weight: 500; }
            tbody th { font-weight: 500; white-space: nowrap; }
            td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
            td.unit { color: var(--muted); white-space: nowrap; }
            td.sep, th.sep { border-left: 1.5px solid var(--rule); }
            td.rounded { font-weight: 700; text-decoration: underline dotted; }
            tr.total td, tr.total th { border-top: 1.5px solid var(--ink); font-weight: 600; }
            .note { color: var(--muted); font-size: 12px; margin: 2px 0 6px; }
            .badge { display: inline-block; min-width: 4.6em; padding: 1px 6px; border: 1.5px solid var(--ink);
                     font: 700 12px/1.3 system-ui, "DejaVu Sans", Arial, sans-serif; text-align: center;
                     letter-spacing: 0.04em; vertical-align: middle; }
            .badge.fail { background: var(--fail); border-color: var(--fail); color: #fff; }
            .badge.warn { background: var(--warn); border-color: #8a5f00; color: #1d1d1b; border-style: dashed; }
            .badge.pass { background: #fff; border-color: #2f6f3e; color: #2f6f3e; }
            .badge.bad { background: var(--bad); border-color: var(--bad); color: #fff; }
            .sev { display: inline-block; min-width: 3.4em; font-weight: 700; font-size: 12px; }
            .sev.fail { color: var(--fail); }
            .sev.warn { color: #7a5200; }
            .sev.info { color: var(--muted); }
            section.loop { border-top: 2px solid var(--ink); padding: 8px 0 6px; margin-top: 14px; }
            section.loop > header { display: flex; flex-wrap: wrap; align-items: baseline; gap: 4px 12px; }
            section.loop > header .where { color: var(--muted); font-size: 13px; }
            section.loop > header .top { margin-left: auto; font-size: 12px; }
            section.loop p { margin: 4px 0; }
            ul.findings, ul.problems { margin: 4px 0 6px; padding-left: 0; list-style: none; }
            ul.findings li, ul.problems li { margin: 3px 0; padding-left: 8px; border-left: 3px solid var(--rule); }
            ul.findings li.fail { border-left: 4px solid var(--fail); }
            ul.findings li.warn { border-left: 4px solid #c8890f; }
            ul.findings .why { display: block; color: var(--muted); font-size: 12px; }
            ul.problems li, .badrows li { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 12.5px; }
            .badrows { padding-left: 20px; }
            ul.problems li, .badrows li, ul.findings li { overflow-wrap: anywhere; }
            details.plots > summary { cursor: pointer; color: var(--muted); font-size: 13px; margin: 4px 0; }
            .panels { display: flex; flex-wrap: wrap; gap: 6px 14px; }
            .panels figure { margin: 0; }
            .panels svg, .verdict-bar { max-width: 100%; height: auto; }
            footer { margin-top: 28px; border-top: 1px solid var(--rule); padding-top: 8px; color: var(--muted);
                     font-size: 12px; }
            @media print {
              body { max-width: none; padding: 0; font-size: 9pt; }
              p.filter, #filter-count { display: none; }
              table { font-size: 8pt; }
              table.index { font-size: 7.5pt; }
              table.index tr { break-inside: avoid; }
              #index, #provenance { break-before: page; }
              section.loop { margin-top: 6px; padding-top: 4px; break-inside: avoid-page; }
              .cols { display: grid; grid-template-columns: 1fr 1fr; gap: 4px 14px; }
              .cols > div { display: block; margin: 0; }
              .panels figure { width: 32%; }
              table.signoff td.sign { height: 2.6em; }
              a { color: inherit; text-decoration: none; }
              section.loop > header .top, details.plots > summary { display: none; }
              section.loop > header, h2, h3, caption { break-after: avoid; }
              table:not(.index), figure, .cautions, ul.findings li { break-inside: avoid; }
              .panels svg { width: 100%; }
              .badge, .verdict-bar { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
            }
            """;

    /**
     * The printed page's margin boxes (CSS Paged Media Level 3, section 5): the report's title and
     * its input fingerprint at the top of every page, "page N of M" at the bottom.
     */
    static String pageBoxes(AuditInfo info) {
        return "@page { size: A4; margin: 16mm 11mm 14mm;\n"
                + "  @top-left { content: \"" + cssString(info.title()) + "\"; font: 8pt sans-serif; color: #5a5a55; }\n"
                + "  @top-right { content: \"inputs " + info.shortFingerprint()
                + "\"; font: 8pt monospace; color: #5a5a55; }\n"
                + "  @bottom-right { content: \"page \" counter(page) \" of \" counter(pages); font: 8pt sans-serif; }\n"
                + "  @bottom-left { content: \"" + cssString(info.signOff().change().isEmpty() ? ""
                : "change " + info.signOff().change() + (info.signOff().revision().isEmpty() ? ""
                : ", revision " + info.signOff().revision())) + "\"; font: 8pt sans-serif; }\n}\n";
    }

    /** {@code s} safe inside a double-quoted CSS string and inside a style element. */
    private static String cssString(String s) {
        StringBuilder sb = new StringBuilder();
        for (char c : s.toCharArray()) {
            if (c == '"' || c == '\\' || c == '<' || c == '>' || c < 0x20) {
                sb.append('\\').append(Integer.toHexString(c)).append(' ');
            } else {
                sb.append(c);
            }
        }
        return sb.toString();
    }
}
