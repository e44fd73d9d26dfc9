package org.loopform.io;

import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.loopform.audit.InputFile;

import java.io.IOException;
import java.io.InputStream;
import java.net.URISyntaxException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Enumeration;
import java.util.List;
import java.util.jar.JarEntry;
import java.util.jar.JarFile;
import java.util.stream.Stream;
import org.loopform.form.Catalog;
import org.loopform.form.FormDefinition;

/**
 * Loads the bundled catalog ({@code forms-catalog/*.yaml}, packed into the jar) and resolves a
 * form given as a catalog id or as a file path.
 */
public final class CatalogLoader {

    private static final String FOLDER = "forms-catalog/";
    private static volatile Catalog bundled;

    private CatalogLoader() {
    }

    /** The catalog shipped with loopform. */
    public static Catalog bundled() {
        Catalog c = bundled;
        if (c == null) {
            synchronized (CatalogLoader.class) {
                if (bundled == null) {
                    bundled = load();
                }
                c = bundled;
            }
        }
        return c;
    }

    /**
     * The form named by {@code idOrPath}: a catalog id, or else a form file. {@code option} names
     * the flag in messages.
     */
    public static FormDefinition resolve(String idOrPath, String option) {
        Catalog catalog = bundled();
        var found = catalog.find(idOrPath.trim());
        if (found.isPresent()) {
            return found.get();
        }
        Path p = UserPath.of(idOrPath, option, "a catalog id or the path of a form file");
        if (Files.isRegularFile(p)) {
            FormDefinition form = FormFileReader.read(p, idOrPath);
            Path key = p.toAbsolutePath().normalize();
            FORM_FILES_READ.computeIfAbsent(key, k -> new InputFile("form", idOrPath, Fingerprint.sha256(p, idOrPath)));
            LAST_READ.put(key, READS.incrementAndGet());
            return form;
        }
        throw new InputException(option + ": unknown form '" + UserPath.visible(idOrPath) + "'; give a catalog id ("
                + String.join(", ", catalog.ids()) + ") or the path of a form file");
    }

    /** Every form file read by path in this process, with its fingerprint (the audit's provenance lists them). */
    private static final Map<Path, InputFile> FORM_FILES_READ = new ConcurrentHashMap<>();
    /** When each was last read, counted in reads, so that one run can ask for its own. */
    private static final Map<Path, Long> LAST_READ = new ConcurrentHashMap<>();
    private static final java.util.concurrent.atomic.AtomicLong READS = new java.util.concurrent.atomic.AtomicLong();

    /** A mark to pass to {@link #formFilesReadSince} (take it before a run reads its inputs). */
    public static long formReadMark() {
        return READS.get();
    }

    /** The form files read by path since {@code mark}, each once, by name. */
    public static List<InputFile> formFilesReadSince(long mark) {
        return LAST_READ.entrySet().stream().filter(e -> e.getValue() > mark).map(e -> FORM_FILES_READ.get(e.getKey()))
                .sorted(java.util.Comparator.comparing(InputFile::name)).toList();
    }

    private static Catalog load() {
        List<FormDefinition> forms = new ArrayList<>();
        for (String name : entryNames()) {
            try (InputStream in = CatalogLoader.class.getClassLoader().getResourceAsStream(FOLDER + name)) {
                if (in == null) {
                    continue;
                }
                String text = new String(in.readAllBytes(), StandardCharsets.UTF_8);
                forms.add(FormFileReader.parse(text, FOLDER + name));
            } catch (IOException e) {
                throw new IllegalStateException("cannot read bundled form " + name, e);
            }
        }
        return new Catalog(forms);
    }

    private static List<String> entryNames() {
        List<String> names = new ArrayList<>();
        try {
            Path location = Path.of(CatalogLoader.class.getProtectionDomain().getCodeSource().getLocation().toURI());
            if (Files.isDirectory(location)) {
                Path dir = location.resolve(FOLDER);
                if (Files.isDirectory(dir)) {
                    try (Stream<Path> s = Files.list(dir)) {
                        s.map(x -> x.getFileName().toString()).filter(n -> n.endsWith(".yaml")).sorted()
                                .forEach(names::add);
                    }
                }
            } else {
                try (JarFile jar = new JarFile(location.toFile())) {
                    Enumeration<JarEntry> e = jar.entries();
                    while (e.hasMoreElements()) {
                        String n = e.nextElement().getName();
                        if (n.startsWith(FOLDER) && n.endsWith(".yaml") && n.indexOf('/', FOLDER.length()) < 0) {
                            names.add(n.substring(FOLDER.length()));
                        }
                    }
                }
            }
        } catch (IOException | URISyntaxException e) {
            throw new IllegalStateException("cannot list the bundled catalog", e);
        }
        names.sort(null);
        return names;
    }
}
