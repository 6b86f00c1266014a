import { appendFileSync } from "node:fs";

export async function resolve(specifier, context, nextResolve) {
  const file = process.env.BETABOUND_TRACE_FILE;
  if (
    file &&
    !specifier.startsWith(".") &&
    !specifier.startsWith("/") &&
    !specifier.startsWith("file:") &&
    !specifier.startsWith("node:")
  ) {
    appendFileSync(file, `${specifier}\n`);
  }
  return nextResolve(specifier, context);
}
