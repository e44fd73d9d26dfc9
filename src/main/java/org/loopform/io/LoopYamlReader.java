package org.loopform.io;

import org.loopform.units.BadInput;
import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.nio.file.Path;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Deque;
import java.util.Iterator;
import java.util.List;
import java.util.NoSuchElementException;
import java.util.Set;
import java.util.function.LongSupplier;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;
import org.loopform.check.LoopSpec;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.composer.Composer;
import org.yaml.snakeyaml.error.Mark;
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.events.DocumentEndEvent;
import org.yaml.snakeyaml.events.Event;
import org.yaml.snakeyaml.events.ScalarEvent;
import org.yaml.snakeyaml.events.StreamEndEvent;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.parser.Parser;
import org.yaml.snakeyaml.parser.ParserImpl;
import org.yaml.snakeyaml.reader.StreamReader;
import org.yaml.snakeyaml.resolver.Resolver;

/**
 * Reads a YAML loop list ({@code loops:} holding loop blocks, or a single loop block) a block at a
 * time, reading its input once, so that memory stays bounded however long the list is and a pipe
 * works like a file. Each block is composed alone (aliases refer to anchors in the same block);
 * a block that cannot be read becomes a bad row with its problems, and so does a repeated tag;
 * problems of the file itself (not YAML, not UTF-8, a limit) are thrown with the file and line.
 */
public final class LoopYamlReader implements Iterator<LoopRow>, AutoCloseable {

    private final String name;
    private final Reader in;
    private final LongSupplier bytesRead;
    private final LoopDefaults defaults;
    private final LoaderOptions options = YamlSource.options(YamlSource.MAX_STREAMED_CODE_POINTS);
    private final Parser parser;
    private final TagIndex seen = new TagIndex();
    private final Event streamStart;
    private final Event documentStart;
    /** Blocks composed whole (a file of one loop block); empty while streaming the loops list. */
    private final Deque<YamlNode> composed = new ArrayDeque<>();
    private boolean streaming;
    private int index;

    private LoopYamlReader(Reader in, LongSupplier bytesRead, String name, LoopDefaults defaults) {
        this.name = name;
        this.in = in;
        this.bytesRead = bytesRead;
        this.defaults = defaults;
        this.parser = new ParserImpl(new StreamReader(in), options);
        this.streamStart = event();
        if (check(Event.ID.StreamEnd)) {
            throw new InputException(name + ":1: the file is empty; a loop list is 'loops:' followed by loop blocks");
        }
        this.documentStart = event();
        if (!check(Event.ID.MappingStart)) {
            throw new InputException(name + ":" + line(peek()) + ": a loop list is a mapping with 'loops:' holding"
                    + " loop blocks");
        }
        Event mappingStart = event();
        if (peek() instanceof ScalarEvent key && key.getValue().equals("loops")) {
            event();
            if (!check(Event.ID.SequenceStart)) {
                throw new InputException(name + ":" + line(peek()) + ": loops: expected a list of loop blocks, each"
                        + " starting with '- tag: ...'");
            }
            event();
            streaming = true;
        } else {
            // a single loop block, or 'loops' after other keys: small, composed whole
            List<Event> block = new ArrayList<>(List.of(mappingStart));
            collect(block, 1);
            YamlNode root = compose(block);
            if (root.get("loops").isPresent()) {
                throw new InputException(root.unknownKeys(Set.of("loops")));
            }
            composed.add(root);
            finish();
        }
    }

    /** Opens the loop list at {@code path}; file-level problems are thrown at once. */
    public static LoopYamlReader open(Path path, String shownName, LoopDefaults defaults) {
        Utf8Reader r = TextInput.open(path, shownName);
        try {
            return new LoopYamlReader(r, r::bytesRead, shownName, defaults);
        } catch (RuntimeException e) {
            LoopFields.closeQuietly(r);
            throw e;
        }
    }

    /** Reads a loop list from YAML text (tests). */
    public static LoopYamlReader of(String text, String shownName, LoopDefaults defaults) {
        return new LoopYamlReader(new StringReader(text), () -> -1, shownName, defaults);
    }

    /** Bytes read from the file so far (for progress), or -1 when the source does not count them. */
    public long bytesRead() {
        return bytesRead.getAsLong();
    }

    @Override
    public boolean hasNext() {
        if (!composed.isEmpty()) {
            return true;
        }
        if (!streaming) {
            return false;
        }
        if (check(Event.ID.SequenceEnd)) {
            event();
            streaming = false;
            if (peek() instanceof ScalarEvent key) {
                throw new InputException(name + ":" + line(key) + ": " + key.getValue() + ": unknown key; expected"
                        + " one of loops");
            }
            event(); // the root mapping's end
            finish();
            return false;
        }
        List<Event> block = new ArrayList<>();
        block.add(event());
        if (block.get(0).is(Event.ID.MappingStart) || block.get(0).is(Event.ID.SequenceStart)) {
            collect(block, 1);
        }
        composed.add(compose(block));
        return true;
    }

    @Override
    public LoopRow next() {
        if (!hasNext()) {
            throw new NoSuchElementException();
        }
        YamlNode item = composed.poll();
        int i = index++;
        String where = item.file() + ":" + item.line();
        String tag = item.isMapping() && item.get("tag").isPresent() && item.get("tag").get().isScalar()
                ? item.get("tag").get().text() : "";
        try {
            List<String> duplicates = YamlSource.duplicateKeys(item.node(), name);
            if (!duplicates.isEmpty()) {
                return LoopRow.bad(i, tag, where, duplicates);
            }
            LoopFileReader.Read read = LoopFileReader.read(item, defaults.targetForm() != null);
            LoopSpec spec = read.spec();
            int first = seen.putIfAbsent(spec.tag(), item.line());
            if (first >= 0) {
                return LoopRow.bad(i, tag, where, List.of(where + ": tag: duplicate tag " + tag + " (first at "
                        + name + ":" + first + "); every loop needs its own tag"));
            }
            return read.byRule() == null ? LoopRow.of(i, defaults.apply(spec))
                    : LoopRow.byRule(i, defaults.apply(spec), read.byRule());
        } catch (BadInput e) {
            // only bad input becomes a bad row; anything else is a bug of loopform and stops the run
            return LoopRow.bad(i, tag, where, e instanceof InputException ? e.problems()
                    : e.problems().stream().map(m -> where + ": " + m).toList());
        }
    }

    /** Adds events to {@code block} until the collection opened at {@code depth} closes. */
    private void collect(List<Event> block, int depth) {
        while (depth > 0) {
            Event e = event();
            if (e.is(Event.ID.MappingStart) || e.is(Event.ID.SequenceStart)) {
                if (++depth > YamlSource.MAX_NESTING) {
                    throw YamlSource.tooDeep(name);
                }
            } else if (e.is(Event.ID.MappingEnd) || e.is(Event.ID.SequenceEnd)) {
                depth--;
            }
            block.add(e);
        }
    }

    private YamlNode compose(List<Event> block) {
        Mark end = block.get(block.size() - 1).getEndMark();
        List<Event> events = new ArrayList<>(block.size() + 4);
        events.add(streamStart);
        events.add(documentStart);
        events.addAll(block);
        events.add(new DocumentEndEvent(end, end, false));
        events.add(new StreamEndEvent(end, end));
        try {
            Node node = new Composer(new EventListParser(events), new Resolver(), options).getSingleNode();
            return new YamlNode(node, "", name);
        } catch (YAMLException e) {
            throw YamlSource.problem(e, name, null);
        } catch (StackOverflowError e) {
            throw YamlSource.tooDeep(name);
        }
    }

    /** After the root mapping: the document ends, and no second one follows. */
    private void finish() {
        event(); // document end
        if (!check(Event.ID.StreamEnd)) {
            throw new InputException(name + ":" + line(peek()) + ": a second YAML document ('---'); a loop list is"
                    + " one document with one 'loops:' list");
        }
    }

    private Event event() {
        try {
            return parser.getEvent();
        } catch (YAMLException e) {
            throw YamlSource.problem(e, name, null);
        } catch (StackOverflowError e) {
            throw YamlSource.tooDeep(name);
        }
    }

    private Event peek() {
        try {
            return parser.peekEvent();
        } catch (YAMLException e) {
            throw YamlSource.problem(e, name, null);
        }
    }

    private boolean check(Event.ID id) {
        try {
            return parser.checkEvent(id);
        } catch (YAMLException e) {
            throw YamlSource.problem(e, name, null);
        }
    }

    private static int line(Event e) {
        return e != null && e.getStartMark() != null ? e.getStartMark().getLine() + 1 : 1;
    }

    @Override
    public void close() {
        try {
            in.close();
        } catch (IOException e) {
            // reading is over; nothing was written
        }
    }
}
