package org.loopform.io;

import java.util.List;
import org.yaml.snakeyaml.events.Event;
import org.yaml.snakeyaml.parser.Parser;

/** A parser that replays a list of events, so one block of a long YAML stream can be composed alone. */
final class EventListParser implements Parser {

    private final List<Event> events;
    private int next;

    EventListParser(List<Event> events) {
        this.events = events;
    }

    @Override
    public boolean checkEvent(Event.ID id) {
        return next < events.size() && events.get(next).is(id);
    }

    @Override
    public Event peekEvent() {
        return next < events.size() ? events.get(next) : null;
    }

    @Override
    public Event getEvent() {
        return next < events.size() ? events.get(next++) : null;
    }
}
