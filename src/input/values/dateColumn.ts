/**
 * Reading a whole date column. Without an explicit layout each date must be unambiguous (see
 * `parseUnambiguousDate`) or a slash date A/B/YYYY. Slash dates are read day-first or month-first
 * for the whole column: the reading under which every slash date is a real calendar date wins;
 * when both readings work and they differ for some date, the column is ambiguous.
 */
import { compileDateFormat } from "./dateFormat.js";
import { parseUnambiguousDate, plainIsoDateKey, slashReadings, type ParsedDate, type SlashReadings } from "./dates.js";

/** Outcome for a column: sort keys and ISO texts (key NaN where a date could not be read), or the first ambiguous date. */
export type DateColumn =
  | { readonly kind: "dates"; readonly keys: Float64Array; readonly isos: readonly string[] }
  | { readonly kind: "ambiguous"; readonly index: number; readonly dayFirst: string; readonly monthFirst: string }
  | { readonly kind: "bad-format"; readonly reason: string };

/** Parse every text of a date column, with an optional explicit layout (see `compileDateFormat`). */
export function readDateColumn(texts: readonly string[], dateFormat?: string): DateColumn {
  if (dateFormat !== undefined) {
    const parser = compileDateFormat(dateFormat);
    if (typeof parser === "string") return { kind: "bad-format", reason: parser };
    const keys = new Float64Array(texts.length);
    const isos = new Array<string>(texts.length);
    texts.forEach((text, i) => set(keys, isos, i, parser(text)));
    return { kind: "dates", keys, isos };
  }
  const keys = new Float64Array(texts.length);
  let isos = texts as string[];
  let copied = false;
  const put = (index: number, date: ParsedDate | null): void => {
    if (!copied && date !== null && date.iso !== texts[index]) {
      isos = texts.slice();
      copied = true;
    }
    set(keys, isos, index, date);
  };
  const slashes: { index: number; readings: SlashReadings }[] = [];
  for (let index = 0; index < texts.length; index++) {
    const text = texts[index] as string;
    const key = plainIsoDateKey(text);
    keys[index] = key;
    if (!Number.isNaN(key)) continue;
    const date = parseUnambiguousDate(text);
    if (date !== null) put(index, date);
    else {
      const readings = slashReadings(text);
      if (readings) slashes.push({ index, readings });
    }
  }
  if (slashes.length === 0) return { kind: "dates", keys, isos };
  const dayFirstFails = slashes.filter((s) => s.readings.dayFirst === null).length;
  const monthFirstFails = slashes.filter((s) => s.readings.monthFirst === null).length;
  if (dayFirstFails === 0 && monthFirstFails === 0) {
    const differing = slashes.find((s) => s.readings.dayFirst?.key !== s.readings.monthFirst?.key);
    if (differing) {
      const { dayFirst, monthFirst } = differing.readings;
      return { kind: "ambiguous", index: differing.index, dayFirst: dayFirst?.iso ?? "", monthFirst: monthFirst?.iso ?? "" };
    }
  }
  const useDayFirst = dayFirstFails <= monthFirstFails;
  for (const { index, readings } of slashes) put(index, useDayFirst ? readings.dayFirst : readings.monthFirst);
  return { kind: "dates", keys, isos };
}

function set(keys: Float64Array, isos: string[], index: number, date: ParsedDate | null): void {
  keys[index] = date === null ? Number.NaN : date.key;
  if (date !== null) isos[index] = date.iso;
}
