/** Collects issues up to a cap, so a file full of bad values yields a readable report. */
import type { InputIssue } from "./issues.js";

/** At most this many issues are kept; the rest are counted in a final "too-many-issues". */
export const MAX_ISSUES = 50;

/** An append-only, capped list of issues. */
export class IssueList {
  private readonly items: InputIssue[] = [];
  private omitted = 0;

  constructor(private readonly source: string) {}

  add(issue: InputIssue): void {
    if (this.items.length < MAX_ISSUES) this.items.push(issue);
    else this.omitted++;
  }

  addAll(issues: readonly InputIssue[]): void {
    for (const issue of issues) this.add(issue);
  }

  get empty(): boolean {
    return this.items.length === 0;
  }

  /** The issues in line order (stable; issues without a line first), then "too-many-issues" when some were left out. */
  list(): InputIssue[] {
    const sorted = [...this.items].sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    return this.omitted === 0 ? sorted : [...sorted, { code: "too-many-issues", source: this.source, omitted: this.omitted }];
  }
}
