/**
 * A config file with several jobs: `{"jobs": [{"files": [...], "pair": [...], "rf": ...}, ...]}`. The
 * keys beside `jobs` are every job's defaults; each job's keys override them, and each job's pairs are
 * solved on its own files only. The output keys (`format`, `output`, `chart`, `report`) are the run's,
 * so they live beside `jobs`, not in a job, as do the commands' sections of a shared file (config.ts). A file
 * without `jobs` is one job. Pure: text in, values out.
 */
import { failure, type Result, success } from "../core/result.js";
import { type ConfigContents, type ConfigProblem, configObject, isSection, ownSection, parseConfigObject } from "./config.js";
import type { CommandName } from "./table.js";

/** Keys that describe the whole run's output: at the top level only. */
const runKeys = ["format", "output", "chart", "report"] as const;

/** The jobs of a config file's text, each with the top-level keys (and the command's section) as its defaults. */
export function parseConfigJobs(text: string, command: CommandName): Result<ConfigContents[], ConfigProblem> {
  const data = configObject(text);
  if (!data.ok) return data;
  if (!("jobs" in data.value)) {
    const single = parseConfigObject(data.value, command);
    return single.ok ? success([single.value]) : single;
  }
  if (command !== "solve") return failure({ at: "jobs", reason: "only solve runs several jobs from one file" });
  const keys = ownSection(data.value, command);
  if (!keys.ok) return keys;
  const { jobs, ...defaults } = keys.value as { jobs: unknown } & Record<string, unknown>;
  if (!Array.isArray(jobs) || jobs.length === 0) return failure({ at: "jobs", reason: "must be a non-empty list of objects" });
  const parsed: ConfigContents[] = [];
  for (const [i, job] of jobs.entries()) {
    const at = `jobs.${i}`;
    if (typeof job !== "object" || job === null || Array.isArray(job)) return failure({ at, reason: "must be a JSON object" });
    const own = Object.keys(job).find((key) => key === "jobs" || isSection(key) || (runKeys as readonly string[]).includes(key));
    if (own !== undefined) return failure({ at: `${at}.${own}`, reason: "belongs at the top level, beside jobs (one output for the run)" });
    const contents = parseConfigObject({ ...defaults, ...job }, command);
    if (!contents.ok)
      return failure({ at: contents.issues.at === "" ? at : `${at}.${contents.issues.at}`, reason: contents.issues.reason });
    parsed.push(contents.value);
  }
  return success(parsed);
}
