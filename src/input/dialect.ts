/** Guessing the field delimiter of a delimited text file. */

/** The delimiters tried by `detectDelimiter`, in order of preference on a tie. */
export const candidateDelimiters = [",", ";", "\t"] as const;

const SAMPLE_LINES = 64;

function countFields(line: string, delimiter: string): number {
  // A longer delimiter never splits a line (the candidates are single characters).
  if (delimiter.length !== 1) return 1;
  let fields = 1;
  // Without a quote every occurrence splits the line: found by indexOf, natively, rather than by a
  // loop over the characters (which V8 would interpret: a few milliseconds a file at start-up).
  if (line.indexOf('"') < 0) {
    for (let at = line.indexOf(delimiter); at >= 0; at = line.indexOf(delimiter, at + 1)) fields++;
    return fields;
  }
  const code = delimiter.charCodeAt(0);
  let quoted = false;
  // By UTF-16 unit: the quote and the delimiters are single units, which no surrogate half equals.
  for (let i = 0; i < line.length; i++) {
    const unit = line.charCodeAt(i);
    if (unit === 34) quoted = !quoted;
    else if (unit === code && !quoted) fields++;
  }
  return fields;
}

/**
 * The first `count` non-blank lines of `text` (lines end at CRLF, LF or a lone CR), found one at a
 * time: the same lines as splitting all of the text and keeping the first non-blank ones.
 */
function firstLines(text: string, count: number): string[] {
  const lines: string[] = [];
  let from = 0;
  // The next line feed and carriage return at or after `from` (-1: none), each searched again only
  // once passed.
  let lf = text.indexOf("\n");
  let cr = text.indexOf("\r");
  while (lines.length < count) {
    if (lf >= 0 && lf < from) lf = text.indexOf("\n", from);
    if (cr >= 0 && cr < from) cr = text.indexOf("\r", from);
    const end = Math.min(lf < 0 ? text.length : lf, cr < 0 ? text.length : cr);
    const line = text.slice(from, end);
    if (line.trim() !== "") lines.push(line);
    if (end >= text.length) break;
    from = end + (text.charCodeAt(end) === 13 && text.charCodeAt(end + 1) === 10 ? 2 : 1);
  }
  return lines;
}

function modeOf(values: readonly number[]): { value: number; frequency: number } {
  const tally = new Map<number, number>();
  for (const v of values) tally.set(v, (tally.get(v) ?? 0) + 1);
  let best = { value: 1, frequency: 0 };
  for (const [value, frequency] of tally) {
    if (frequency > best.frequency || (frequency === best.frequency && value > best.value)) best = { value, frequency };
  }
  return best;
}

/**
 * The delimiter (comma, semicolon or tab) that splits the most of the first 64 non-blank lines into
 * the same number of fields (at least two); the first candidate when nothing fits. Quotes are
 * respected within a line.
 */
export function detectDelimiter(text: string, candidates: readonly string[] = candidateDelimiters): string {
  const head = text.length > 65536 ? text.slice(0, text.lastIndexOf("\n", 65536) + 1 || 65536) : text;
  const lines = firstLines(head, SAMPLE_LINES);
  let best: string = candidates[0] ?? ",";
  let bestScore = 0;
  for (const delimiter of candidates) {
    const { value, frequency } = modeOf(lines.map((line) => countFields(line, delimiter)));
    const score = value >= 2 ? frequency : 0;
    if (score > bestScore) {
      best = delimiter;
      bestScore = score;
    }
  }
  return best;
}
