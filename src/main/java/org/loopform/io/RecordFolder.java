package org.loopform.io;

import java.io.IOException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.function.Function;
import org.loopform.audit.InputFile;
import org.loopform.audit.RecordSource;
import org.loopform.replay.Trend;

/**
 * A folder of logged records, one CSV per loop named after its tag. The record of tag {@code T}
 * is the file {@code T.csv} in the folder; when there is none, the one file whose name equals it
 * without regard to case ({@code tic-301.csv} for {@code TIC-301}, {@code .CSV} too). Two files
 * that match a tag only without regard to case make that loop's record ambiguous (a problem for
 * that loop). The folder is listed once, when opened; files are read when their loop is audited.
 */
public final class RecordFolder implements RecordSource {

    private final String shown;
    private final Map<String, Path> exact = new HashMap<>();
    private final Map<String, List<Path>> folded = new HashMap<>();
    private final TrendColumns columns;
    /** Records found, by shown name, with their SHA-256 (sorted, so the provenance is the same on any thread count). */
    private final java.util.concurrent.ConcurrentSkipListMap<String, String> read =
            new java.util.concurrent.ConcurrentSkipListMap<>();

    /** The records some tag of the list matched (read or not). */
    private final java.util.Set<Path> matched = java.util.concurrent.ConcurrentHashMap.newKeySet();

    private RecordFolder(String shown, TrendColumns columns) {
        this.shown = shown;
        this.columns = columns;
    }

    /** The records in {@code dir} (shown as {@code shownName}), read with {@code columns}. */
    public static RecordFolder open(Path dir, String shownName, TrendColumns columns) {
        if (!Files.isDirectory(dir)) {
            throw new InputException(shownName + ": --records: not a folder; give the folder that holds one TAG.csv"
                    + " record per loop");
        }
        RecordFolder f = new RecordFolder(shownName, columns);
        try (DirectoryStream<Path> files = Files.newDirectoryStream(dir)) {
            for (Path p : files) {
                String name = p.getFileName().toString();
                if (name.toLowerCase(Locale.ROOT).endsWith(".csv") && Files.isRegularFile(p)) {
                    String stem = name.substring(0, name.length() - 4);
                    f.exact.put(stem, p);
                    f.folded.computeIfAbsent(stem.toLowerCase(Locale.ROOT), k -> new ArrayList<>()).add(p);
                }
            }
        } catch (IOException e) {
            throw new InputException(shownName + ": --records: cannot be listed (" + OutputFolder.reason(e)
                    + "); check the folder is readable");
        }
        return f;
    }

    /**
     * Records from any place that can hand a tag's CSV text (the demo's bundled records):
     * {@code text} returns the text of {@code TAG.csv}, or null when there is none.
     */
    public static RecordSource ofText(String shownName, Function<String, String> text, TrendColumns columns) {
        java.util.concurrent.ConcurrentSkipListMap<String, String> found = new java.util.concurrent.ConcurrentSkipListMap<>();
        return new RecordSource() {
            @Override
            public Optional<Trend> find(String tag) {
                String t = text.apply(tag);
                if (t == null) {
                    return Optional.empty();
                }
                String name = shownName + "/" + tag + ".csv";
                found.put(name, Fingerprint.sha256(t.getBytes(java.nio.charset.StandardCharsets.UTF_8)));
                return Optional.of(TrendCsvReader.parse(t, name, columns));
            }

            @Override
            public List<InputFile> filesRead() {
                return found.entrySet().stream().map(e -> new InputFile("record", e.getKey(), e.getValue())).toList();
            }
        };
    }

    /** The folder as the user named it. */
    public String shownName() {
        return shown;
    }

    /** How many CSV files the folder holds. */
    public int size() {
        return exact.size();
    }

    @Override
    public Optional<Trend> find(String tag) {
        Path p = exact.get(tag);
        if (p == null) {
            List<Path> same = folded.getOrDefault(tag.toLowerCase(Locale.ROOT), List.of());
            if (same.size() > 1) {
                throw new InputException(shown + ": records " + same.stream().map(x -> x.getFileName().toString())
                        .sorted().toList() + " all match tag " + tag + " without regard to case, and none is named "
                        + tag + ".csv exactly; rename the one that belongs to the loop " + tag + ".csv");
            }
            p = same.isEmpty() ? null : same.get(0);
        }
        if (p == null) {
            return Optional.empty();
        }
        String name = shown + "/" + p.getFileName();
        read.put(name, Fingerprint.sha256(p, name));
        return Optional.of(TrendCsvReader.read(p, name, columns));
    }

    /**
     * Marks the record {@code tag} would take as matched: {@code TAG.csv}, or when there is none every
     * file that equals it without regard to case (one is taken; two or more are that loop's problem).
     */
    @Override
    public void seen(String tag) {
        if (tag == null) {
            return;
        }
        Path p = exact.get(tag);
        if (p != null) {
            matched.add(p);
        } else {
            matched.addAll(folded.getOrDefault(tag.toLowerCase(Locale.ROOT), List.of()));
        }
    }

    /** The records no tag of the list matched, each as {@code FOLDER/NAME.csv}, in name order. */
    @Override
    public List<String> unmatched() {
        return exact.values().stream().filter(p -> !matched.contains(p))
                .map(p -> shown + "/" + p.getFileName()).sorted().toList();
    }

    @Override
    public List<InputFile> filesRead() {
        return read.entrySet().stream().map(e -> new InputFile("record", e.getKey(), e.getValue())).toList();
    }
}
