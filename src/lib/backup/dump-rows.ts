/**
 * Rows per table in a mariadb-dump file, read from the dump itself, so a backup's counts are the
 * counts of the very snapshot it holds (the dump is one transaction; a second connection would
 * see another moment). The dump writes `CREATE TABLE \`t\`` for every table and its rows as
 * `INSERT INTO \`t\` VALUES` statements, the groups on one line or one a line (MariaDB 10.11
 * writes `VALUES` then `(…),` per line); strings are single-quoted with backslash escapes and
 * binary columns are hex literals (--hex-blob), so a row is a parenthesised group at the top level
 * of a VALUES list, counted outside quotes up to the statement's closing `;`.
 */

const CREATE = /^CREATE TABLE `((?:[^`]|``)+)`/;
const INSERT = /^INSERT INTO `((?:[^`]|``)+)` VALUES\s*/;

/** Counts the top-level groups of one VALUES list, fed a piece at a time, until its `;`. */
export class ValueGroups {
  groups = 0;
  ended = false;
  private depth = 0;
  private quote: string | null = null;
  private escaped = false;

  feed(text: string): void {
    for (let index = 0; index < text.length && !this.ended; index += 1) {
      const char = text[index];
      if (this.quote) {
        if (this.escaped) this.escaped = false;
        else if (char === '\\') this.escaped = true;
        else if (char === this.quote) {
          // A doubled quote is a quote inside the string.
          if (text[index + 1] === this.quote) index += 1;
          else this.quote = null;
        }
        continue;
      }
      if (char === "'" || char === '"') this.quote = char;
      else if (char === '(') {
        if (this.depth === 0) this.groups += 1;
        this.depth += 1;
      } else if (char === ')') this.depth -= 1;
      else if (char === ';' && this.depth === 0) this.ended = true;
    }
  }
}

/** Rows of one complete `(…),(…);` list. */
export function countValueGroups(values: string): number {
  const counter = new ValueGroups();
  counter.feed(values);
  if (!counter.ended) throw new Error('The dump ends inside a row: it is cut short.');
  return counter.groups;
}

/** Every table the dump creates, with its row count (0 for an empty table). */
export function rowsPerTable(dump: string): Record<string, number> {
  const rows: Record<string, number> = {};
  let open: { table: string; counter: ValueGroups } | undefined;
  for (const line of dump.split('\n')) {
    if (open) {
      open.counter.feed(`${line}\n`);
      if (open.counter.ended) {
        rows[open.table] = (rows[open.table] ?? 0) + open.counter.groups;
        open = undefined;
      }
      continue;
    }
    const created = CREATE.exec(line);
    if (created) {
      rows[created[1].replaceAll('``', '`')] ??= 0;
      continue;
    }
    const inserted = INSERT.exec(line);
    if (!inserted) continue;
    open = { table: inserted[1].replaceAll('``', '`'), counter: new ValueGroups() };
    open.counter.feed(`${line.slice(inserted[0].length)}\n`);
    if (open.counter.ended) {
      rows[open.table] = (rows[open.table] ?? 0) + open.counter.groups;
      open = undefined;
    }
  }
  if (open) throw new Error('The dump ends inside a row: it is cut short.');
  return rows;
}
