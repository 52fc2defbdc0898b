/**
 * The plain-text form of a Reply: the console prints it, and the chat platforms use it as the text fallback
 * (notifications, screen readers). No markup: aligned columns and blank lines carry the structure.
 */
import type { Fact, Reply, Table } from './reply.js';

/** Visible width of a string: code points, so "±" or "é" count once. */
function width(text: string): number {
  return [...text].length;
}

/** A cell that reads as a number ("412", "-8.4 gal", "48%", "+150 gal") is right-aligned so digits line up. */
function looksNumeric(cell: string): boolean {
  return /^[+-]?[\d,.]+(\s?\S{0,8})?$/.test(cell.trim());
}

function pad(text: string, size: number, right: boolean): string {
  const gap = ' '.repeat(Math.max(0, size - width(text)));
  return right ? gap + text : text + gap;
}

/** Newlines inside a value would break the alignment: fold them into spaces. */
function oneLine(text: string): string {
  return text.replace(/\s*[\r\n\u2028\u2029]+\s*/g, ' ');
}

/** "Label:  value" lines with the values aligned in one column. */
export function factsToText(facts: Fact[]): string[] {
  const labelWidth = Math.max(0, ...facts.map((f) => width(oneLine(f.label))));
  return facts.map((f) => `${pad(`${oneLine(f.label)}:`, labelWidth + 1, false)}  ${oneLine(f.value)}`);
}

/**
 * A table with aligned columns: a header, a rule, then rows. Columns whose cells all read as numbers are
 * right-aligned. Short rows are padded; cells past the header's count are kept under an empty header; blank
 * rows are left out.
 */
export function tableToText(table: Table): string[] {
  // A blank row would print as a blank line, which reads as the end of the table.
  const kept = table.rows.filter((r) => r.some((c) => c.trim() !== ''));
  // Every cell folded to one line once, every row padded to the same width.
  const columnCount = Math.max(table.columns.length, ...kept.map((r) => r.length));
  const fill = (row: string[]) => Array.from({ length: columnCount }, (_, i) => oneLine(row[i] ?? ''));
  const header = fill(table.columns);
  const rows = kept.map(fill);
  const widths = header.map((h, i) => Math.max(width(h), ...rows.map((r) => width(r[i] ?? ''))));
  const numeric = header.map(
    (_, i) => rows.length > 0 && rows.every((r) => r[i] === '' || looksNumeric(r[i] ?? '')),
  );
  const line = (row: string[]) =>
    row
      .map((c, i) => pad(c, widths[i] ?? 0, numeric[i] ?? false))
      .join('  ')
      .trimEnd();
  const rule = widths.map((w) => '-'.repeat(w)).join('  ');
  return [line(header), rule, ...rows.map(line)];
}

/** The whole reply as plain text, blocks separated by a blank line; never ends with a newline. */
export function toPlainText(reply: Reply): string {
  const blocks: string[][] = [[reply.headline.trimEnd()]];
  if (reply.facts && reply.facts.length > 0) blocks.push(factsToText(reply.facts));
  if (reply.table && (reply.table.rows.length > 0 || reply.table.columns.length > 0)) {
    blocks.push(tableToText(reply.table));
  }
  if (reply.caution) blocks.push([`Caution: ${oneLine(reply.caution)}`]);
  if (reply.actions && reply.actions.length > 0) {
    blocks.push([`Next: ${reply.actions.map((a) => `"${oneLine(a.command)}"`).join(' or ')}`]);
  }
  return blocks.map((b) => b.join('\n')).join('\n\n');
}

/** Several replies as the console prints them: each in plain text, separated by a blank line. */
export function repliesToPlainText(replies: Reply[]): string {
  return replies.map(toPlainText).join('\n\n');
}
