/** A computation that either produced a value or a list of typed issues explaining why not. */
export type Result<T, E> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly issues: E };

export const success = <T>(value: T): { readonly ok: true; readonly value: T } => ({ ok: true, value });
export const failure = <E>(issues: E): { readonly ok: false; readonly issues: E } => ({ ok: false, issues });
