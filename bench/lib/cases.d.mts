// Types of cases.mjs for the TypeScript tests (test/bench).
import type { Tolerance } from "./check.mjs";
export const exact: number;
export function solveTolerance(path: string): Tolerance;
export function rollTolerance(name: string): Tolerance;
export function buildCases(): Array<{
  id: string;
  title: string;
  data: string;
  kind: "solve" | "roll" | "batch";
  peers: string[];
  variants: Array<{ label: string; args: string[] }>;
  ours: (file: string, out: string) => string[];
  tolerance?: (path: string) => Tolerance;
  /** A default-settings case of the time-per-row table (timed beside ours on 300 rows). */
  scaling?: boolean;
  job: {
    job: string;
    pairs: string[][];
    window?: number;
    step: number;
    weight: number;
    uncertainty?: boolean;
    dateColumn: string;
    /** What our frequency detection finds in the data's dates (the peers read none): null for minute stamps. */
    periodsPerYear: number | null;
    portfolios?: string[];
  };
}>;
