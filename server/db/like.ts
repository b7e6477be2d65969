/**
 * A LIKE pattern that finds `text` anywhere, with the user's own `%`, `_` and `\` taken literally
 * (MariaDB's default LIKE escape character is the backslash).
 */
export function likeContains(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
