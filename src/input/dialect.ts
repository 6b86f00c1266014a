/** Guessing the field delimiter of a delimited text file. */

/** The delimiters tried by `detectDelimiter`, in order of preference on a tie. */
export const candidateDelimiters = [",", ";", "\t"] as const;

const SAMPLE_LINES = 64;

function countFields(line: string, delimiter: string): number {
  let fields = 1;
  let quoted = false;
  for (const char of line) {
    if (char === '"') quoted = !quoted;
    else if (char === delimiter && !quoted) fields++;
  }
  return fields;
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
  const lines = head.split(/\r\n|\n|\r/).filter((line) => line.trim() !== "").slice(0, SAMPLE_LINES);
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
