package org.loopform.report;

/** What the report says about the audit itself: a title, the input's name, when it ran, and the settings used. */
public record AuditInfo(String title, String input, String generatedAt, String settings) {
}
