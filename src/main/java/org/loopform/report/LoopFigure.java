package org.loopform.report;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.function.Function;
import org.loopform.analysis.MarginNote;
import org.loopform.units.Numbers;

/**
 * The catalogue of a check's figures, side by side for the as-found and the as-left loop: each
 * figure's label and unit (text and HTML tables), its digits, its JSON key, its loops.csv columns
 * and how it is read from one side of the check ({@link LoopSide}). Every output loops over this
 * list; a new figure is one constant here.
 *
 * <p>The constants are declared in the order they were added, which is their order in the
 * machine-readable outputs: a JSON key or a CSV column, once published, keeps its place, and a new
 * figure is declared last (its CSV columns then come after the finding counts, with the other
 * figures added since the first edition). Where a figure stands in the text and HTML tables is its
 * {@code row}.
 *
 * <p>Each constant: table row (order), label, unit, digits in the tables, JSON object and key,
 * loops.csv column stem ({@code design_STEM}, {@code target_STEM}) and which sides have one, then
 * optionally "a row only where a loop has it", and the reader. The setpoint settling time and the
 * load step's output travel have no loops.csv column: its columns were kept as published when the
 * catalogue was built; adding them is a change of the CSV contract, to be made on purpose.
 */
enum LoopFigure {
    PHASE_MARGIN(10, "phase margin", "deg", 3, Group.MARGINS, "phase_margin_deg", "pm_deg", Csv.BOTH,
            s -> Reading.orNone(s.margins().phaseMarginDegrees(), s.margins().phaseMarginNote())),
    GAIN_MARGIN(20, "gain margin", "ratio", 3, Group.MARGINS, "gain_margin", "gm", Csv.BOTH,
            s -> Reading.orNone(s.margins().gainMargin(), s.margins().gainMarginNote())),
    /** The gain crossover where the phase margin is read; missing for the same reason it is. */
    CROSSOVER(30, "crossover", "rad/s", 3, Group.MARGINS, "crossover_rad_s", "crossover_rad_s", Csv.BOTH,
            s -> Reading.orNone(s.margins().crossoverRadPerSecond(), s.margins().phaseMarginNote())),
    MAX_SENSITIVITY(40, "max sensitivity Ms", "ratio", 3, Group.MARGINS, "ms", "ms", Csv.BOTH,
            s -> new Reading.Number(s.margins().maximumSensitivity())),
    DELAY_MARGIN(50, "delay margin", "s", 3, Group.MARGINS, "delay_margin_s", "delay_margin_s", Csv.BOTH,
            s -> Reading.orNone(s.margins().delayMarginSeconds(), s.margins().delayMarginNote())),
    SETPOINT_IAE(60, "setpoint step IAE", "%*s", 4, Group.SETPOINT, "iae", "sp_iae_pct_s", Csv.BOTH,
            s -> new Reading.Number(s.setpoint().integralAbsoluteErrorPercentSeconds())),
    SETPOINT_OVERSHOOT(70, "setpoint overshoot", "% of step", 3, Group.SETPOINT, "overshoot_pct", "sp_overshoot_pct",
            Csv.BOTH, s -> Reading.orNone(s.setpoint().overshootPercent(), Optional.empty())),
    SETPOINT_SETTLING(80, "setpoint settling (2 %)", "s", 4, Group.SETPOINT, "settling_s", null, Csv.NONE,
            s -> Reading.orNone(s.setpoint().settlingTimeSeconds(), Optional.empty())),
    LOAD_IAE(90, "load step IAE", "%*s", 4, Group.LOAD, "iae", "load_iae_pct_s", Csv.BOTH,
            s -> new Reading.Number(s.load().integralAbsoluteErrorPercentSeconds())),
    LOAD_PEAK(100, "load step peak", "%", 4, Group.LOAD, "peak", "load_peak_pct", Csv.BOTH,
            s -> new Reading.Number(s.load().peakDeviationPercent())),
    LOAD_OUTPUT_TRAVEL(110, "output travel (load)", "%", 4, Group.LOAD, "output_travel", null, Csv.NONE,
            s -> new Reading.Number(s.load().outputTravelPercent())),
    // added after the first edition: their CSV columns follow the finding counts
    /** The factor the gain may shrink by; a row in the tables only when a loop has one. */
    LOWER_GAIN_MARGIN(25, "lower gain margin", "ratio", 3, Group.MARGINS, "lower_gain_margin", "lower_gm", Csv.BOTH,
            true, s -> s.margins().lowerGainMargin().isPresent()
                    ? new Reading.Number(s.margins().lowerGainMargin().getAsDouble())
                    : new Reading.None(Optional.of(MarginFigures.NO_LOWER_GAIN_MARGIN))),
    /** The delay margin in scans of a sampled loop; not applicable to a continuous one. */
    DELAY_MARGIN_SCANS(55, "delay margin in scans", "scans", 3, Group.MARGINS, "delay_margin_scans",
            "delay_margin_scans", Csv.TARGET,
            s -> s.scanSeconds() > 0 ? Reading.orNone(s.margins().delayMarginScans(s.scanSeconds()),
                    s.margins().delayMarginNote()) : new Reading.NotApplicable());

    /** The figures added after the first edition (see the class comment): CSV columns after the finding counts. */
    private static final LoopFigure FIRST_ADDED_LATER = LOWER_GAIN_MARGIN;
    /** Significant digits of a figure in loops.csv. */
    static final int CSV_DIGITS = 6;

    /** Where a figure goes in a loop's JSON object: at its top, or in its setpoint or load step object. */
    enum Group {
        MARGINS(null), SETPOINT("setpoint"), LOAD("load");

        private final String jsonObject;

        Group(String jsonObject) {
            this.jsonObject = jsonObject;
        }

        /** The name of this group's object within a loop's JSON object; null for the loop's own keys. */
        String jsonObject() {
            return jsonObject;
        }

        /** The figures of a step response (in JSON, like every figure, null for a loop that is not stable). */
        boolean response() {
            return jsonObject != null;
        }
    }

    /** Which sides of the check have a loops.csv column ({@code design_KEY}, {@code target_KEY}). */
    enum Csv {
        BOTH, TARGET, NONE
    }

    /** A figure as read from one side: a number, none (with why, where known), or not applicable. */
    sealed interface Reading {
        /** A number, possibly not finite (printed as before: Java's text, a blank cell, a JSON null). */
        record Number(double value) implements Reading {
        }

        /** The figure does not exist for this loop, and why where known. */
        record None(Optional<String> why) implements Reading {
        }

        /** The figure does not apply to this loop (the delay margin in scans of a continuous loop). */
        record NotApplicable() implements Reading {
        }

        /**
         * The loop is not stable ({@code word}: unstable or marginal), so the figure is left out:
         * classical margins and Ms read off the open loop are figures of safety only for a loop whose
         * closed loop is stable: they measure how far a stable loop's Nyquist curve keeps from -1
         * (Astrom and Murray, Feedback Systems, 2008, ch. 9-10, from memory for the sections; see
         * docs/references.md section 6), and the responses of a loop that runs away are held only
         * by its output limits.
         */
        record NotStable(String word) implements Reading {
        }

        static Reading orNone(OptionalDouble v, Optional<MarginNote> why) {
            return v.isPresent() ? new Number(v.getAsDouble()) : new None(why.map(MarginNote::text));
        }
    }

    private final int row;
    private final String label;
    private final String unit;
    private final int digits;
    private final Group group;
    private final String jsonKey;
    private final String csvKey;
    private final Csv csv;
    /** True for a figure the tables show only where a loop has it (a number on one side at least). */
    private final boolean rowOnlyWhenPresent;
    private final Function<LoopSide, Reading> read;

    LoopFigure(int row, String label, String unit, int digits, Group group, String jsonKey, String csvKey, Csv csv,
               Function<LoopSide, Reading> read) {
        this(row, label, unit, digits, group, jsonKey, csvKey, csv, false, read);
    }

    LoopFigure(int row, String label, String unit, int digits, Group group, String jsonKey, String csvKey, Csv csv,
               boolean rowOnlyWhenPresent, Function<LoopSide, Reading> read) {
        this.rowOnlyWhenPresent = rowOnlyWhenPresent;
        this.row = row;
        this.label = label;
        this.unit = unit;
        this.digits = digits;
        this.group = group;
        this.jsonKey = jsonKey;
        this.csvKey = csvKey;
        this.csv = csv;
        this.read = read;
    }

    String label() {
        return label;
    }

    String unit() {
        return unit;
    }

    /** The JSON key inside its group's object ({@code setpoint}, {@code load}) or the loop's. */
    String jsonKey() {
        return jsonKey;
    }

    Group group() {
        return group;
    }

    /** The figure of {@code side}, or {@link Reading.NotStable} for every figure of a loop that is not stable. */
    Reading read(LoopSide side) {
        if (!side.stability().isStable()) {
            return new Reading.NotStable(side.stability().verdict().word());
        }
        return read.apply(side);
    }

    /** The figures in the order of the text and HTML tables. */
    static List<LoopFigure> tableOrder() {
        return Arrays.stream(values()).sorted(Comparator.comparingInt(f -> f.row)).toList();
    }

    /**
     * Whether the tables show this figure for {@code sides}: always, except a figure shown only
     * where a loop has it (the lower gain margin).
     */
    boolean shown(LoopSide... sides) {
        if (!rowOnlyWhenPresent) {
            return true;
        }
        return Arrays.stream(sides).anyMatch(s -> read(s) instanceof Reading.Number);
    }

    /** The figure as printed in a table: its digits, "none (why)", or "-" where it does not apply. */
    String text(LoopSide side) {
        return text(read(side), digits);
    }

    /**
     * A reading as printed: {@code digits} significant digits, "none (why)", the stability
     * ("unstable", "marginal") of a loop that is not stable, or "-" where it does not apply.
     */
    static String text(Reading r, int digits) {
        if (r instanceof Reading.Number n) {
            return Numbers.significant(n.value(), digits);
        }
        if (r instanceof Reading.None none) {
            return none.why().map(w -> "none (" + w + ")").orElse("none");
        }
        if (r instanceof Reading.NotStable ns) {
            return ns.word();
        }
        return "-";
    }

    /** The figure in a loops.csv cell: {@link #CSV_DIGITS} digits, blank where there is no finite number (a loop not stable included). */
    String csvCell(LoopSide side) {
        return read(side) instanceof Reading.Number n && Double.isFinite(n.value())
                ? Numbers.significant(n.value(), CSV_DIGITS) : "";
    }

    /** Puts the figure into {@code n} (its group's object), null where there is no finite number. */
    void putJson(ObjectNode n, LoopSide side) {
        Json.putNumber(n, jsonKey, read(side) instanceof Reading.Number x ? x.value() : null);
    }

    /** The figures of one JSON object of a loop, in order. */
    static List<LoopFigure> inGroup(Group g) {
        return Arrays.stream(values()).filter(f -> f.group == g).toList();
    }

    /** Whether the figure has loops.csv columns on the side {@code target} (else the design side). */
    boolean inCsv(boolean target) {
        return csv == Csv.BOTH || (target && csv == Csv.TARGET);
    }

    /** The loops.csv figures of the first edition ({@code addedLater} false) or added since, in column order. */
    static List<LoopFigure> csvFigures(boolean addedLater) {
        return Arrays.stream(values()).filter(f -> f.csv != Csv.NONE)
                .filter(f -> (f.ordinal() >= FIRST_ADDED_LATER.ordinal()) == addedLater).toList();
    }

    /**
     * The loops.csv column names of {@code figures}: the first edition's as design/target pairs
     * ({@code design_pm_deg, target_pm_deg}), in the same order as {@link #csvCells}.
     */
    static List<String> csvColumns(List<LoopFigure> figures) {
        List<String> names = new ArrayList<>();
        for (LoopFigure f : figures) {
            if (f.inCsv(false)) {
                names.add("design_" + f.csvKey);
            }
            if (f.inCsv(true)) {
                names.add("target_" + f.csvKey);
            }
        }
        return names;
    }

    /** The loops.csv cells of {@code figures} for a check's two sides, blank for every column without a process model. */
    static List<String> csvCells(List<LoopFigure> figures, Optional<LoopSide> design, Optional<LoopSide> target) {
        List<String> cells = new ArrayList<>();
        for (LoopFigure f : figures) {
            if (f.inCsv(false)) {
                cells.add(design.map(f::csvCell).orElse(""));
            }
            if (f.inCsv(true)) {
                cells.add(target.map(f::csvCell).orElse(""));
            }
        }
        return cells;
    }
}
