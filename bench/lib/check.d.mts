// Types of check.mjs for the TypeScript tests (test/bench).
export interface Agreement {
  readonly ok: boolean;
  readonly worst: number;
  readonly worstPath: string | null;
  readonly failures: string[];
  readonly compared: number;
}
export type Tolerance = number | { readonly relative: number; readonly floor: number } | null;
export function median(values: readonly number[]): number;
export function ratio(ours: number | null | undefined, theirs: number | null | undefined): number | null;
export function bestPeer(medians: Readonly<Record<string, number | null | undefined>>): { name: string; median: number } | null;
export function relativeDifference(a: number | null | undefined, b: number | null | undefined, floor?: number): number;
export function at(document: unknown, path: string): unknown;
export function compareDigest(ours: unknown, peer: Readonly<Record<string, number>>, tolerance: (path: string) => Tolerance): Agreement;
export function cellValue(text: string): number;
export function rollComparer(
  ourHeader: string,
  peerHeader: string,
  tolerance: (name: string) => Tolerance,
): { row(ourLine: string, peerLine: string): void; result(ourRows: number, peerRows: number): Agreement };
export function seconds(x: number | null | undefined): string;
export function ratioText(x: number | null | undefined): string;
