// A reader for server-sent events (the WHATWG "text/event-stream" format) fed in chunks as a
// fetch body arrives. EventSource cannot POST or send the CSRF header, hence our own. Pure:
// text in, events out.

export interface SseEvent {
  event: string;
  data: string;
}

/**
 * Returns push(chunk) and end(). Events end at a blank line; "event:" names one (default
 * "message"); several "data:" lines join with line breaks; lines starting ":" are comments.
 * A chunk may stop anywhere, even inside a line break pair.
 */
export function createSseReader(onEvent: (event: SseEvent) => void) {
  let buffer = '';
  let eventName = '';
  let dataLines: string[] = [];

  const dispatch = () => {
    if (dataLines.length) onEvent({ event: eventName || 'message', data: dataLines.join('\n') });
    eventName = '';
    dataLines = [];
  };

  const line = (text: string) => {
    if (text === '') return dispatch();
    if (text.startsWith(':')) return;
    const colon = text.indexOf(':');
    const field = colon < 0 ? text : text.slice(0, colon);
    let value = colon < 0 ? '' : text.slice(colon + 1);
    if (value.startsWith(' ')) value = value.slice(1);
    if (field === 'event') eventName = value;
    else if (field === 'data') dataLines.push(value);
  };

  return {
    push(chunk: string) {
      buffer += chunk;
      // A lone "\r" at the very end may be the first half of "\r\n": wait for the next chunk.
      const pattern = /\r\n|\r(?!$)|\n/g;
      let start = 0;
      let match: RegExpExecArray | null;
      while ((match = pattern.exec(buffer))) {
        line(buffer.slice(start, match.index));
        start = match.index + match[0].length;
      }
      buffer = buffer.slice(start);
    },
    /** The stream closed: an event without its final blank line is dropped, as the standard says. */
    end() {
      buffer = '';
      eventName = '';
      dataLines = [];
    },
  };
}
