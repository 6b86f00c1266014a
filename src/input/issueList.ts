/**
 * Collects issues up to a cap, so a file full of bad values yields a readable report: the first few
 * of each kind (code and column) in full, then one "… and N more" line for the rest of that kind.
 */
import type { InputIssue } from "./issues.js";

/** At most this many issues are kept; the rest are counted in a final "too-many-issues". */
export const MAX_ISSUES = 50;
/** Issues of one code in one column shown in full; the rest are counted in one "similar-issues". */
export const SIMILAR_SHOWN = 3;

/** The issues of one code and column beyond the first few: how many, and their first and last lines. */
interface Similar {
  readonly first: InputIssue;
  omitted: number;
  firstLine?: number;
  lastLine?: number;
}

/** An append-only, capped list of issues. */
export class IssueList {
  private readonly items: InputIssue[] = [];
  private readonly kinds = new Map<string, Similar>();
  private readonly counted = new Map<string, number>();
  private omitted = 0;

  constructor(private readonly source: string) {}

  add(issue: InputIssue): void {
    const kind = kindOf(issue);
    const seen = this.counted.get(kind) ?? 0;
    this.counted.set(kind, seen + 1);
    if (seen >= SIMILAR_SHOWN) {
      let similar = this.kinds.get(kind);
      if (similar === undefined) this.kinds.set(kind, (similar = { first: issue, omitted: 0 }));
      similar.omitted++;
      if (issue.line !== undefined) {
        similar.firstLine = Math.min(similar.firstLine ?? issue.line, issue.line);
        similar.lastLine = Math.max(similar.lastLine ?? issue.line, issue.line);
      }
    } else if (this.items.length < MAX_ISSUES) this.items.push(issue);
    else this.omitted++;
  }

  addAll(issues: readonly InputIssue[]): void {
    for (const issue of issues) this.add(issue);
  }

  get empty(): boolean {
    return this.items.length === 0;
  }

  /**
   * The issues in line order (stable; issues without a line first), except that the issues of one
   * kind (code and column) stay together, from where the first of them is, followed by the kind's
   * "similar-issues"; then "too-many-issues" when some were left out.
   */
  list(): InputIssue[] {
    const sorted = [...this.items].sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    const groups = new Map<string, InputIssue[]>();
    for (const issue of sorted) {
      const kind = kindOf(issue);
      const group = groups.get(kind);
      if (group === undefined) groups.set(kind, [issue]);
      else group.push(issue);
    }
    const listed: InputIssue[] = [];
    for (const [kind, group] of groups) {
      listed.push(...group);
      const similar = this.kinds.get(kind);
      if (similar !== undefined) listed.push(this.summary(similar));
    }
    // A kind none of which could be shown (the list was full) is counted with the rest.
    let omitted = this.omitted;
    for (const [kind, similar] of this.kinds) if (!groups.has(kind)) omitted += similar.omitted;
    return omitted === 0 ? listed : [...listed, { code: "too-many-issues", source: this.source, omitted }];
  }

  private summary({ first, omitted, firstLine, lastLine }: Similar): InputIssue {
    const lines = firstLine === undefined || lastLine === undefined ? {} : { firstLine, lastLine };
    const column = first.column === undefined ? {} : { column: first.column };
    return { code: "similar-issues", source: this.source, like: first.code, omitted, ...column, ...lines };
  }
}

/** Issues of the same code in the same column are of one kind. */
const kindOf = (issue: InputIssue): string => `${issue.code}\u0000${issue.column ?? ""}`;
