// E-mail addresses as people read them: a display name and the address, and a place for a long
// address to break (before the @) rather than in the middle of a word.

export interface ParsedAddress {
  name: string | null;
  email: string;
}

/** '"Rowpath reminders" <reminders@rowpath.test>' → { name: 'Rowpath reminders', email: 'reminders@rowpath.test' }. */
export function parseAddress(header: string): ParsedAddress {
  const m = /^\s*"?([^"<]*?)"?\s*<([^>]+)>\s*$/.exec(header);
  if (m) return { name: m[1].trim() || null, email: m[2].trim() };
  return { name: null, email: header.trim() };
}

/** The two halves of an address around the @, so a line can break before it. */
export function splitAtSign(email: string): [string, string] {
  const at = email.lastIndexOf('@');
  return at > 0 ? [email.slice(0, at), email.slice(at)] : [email, ''];
}
