/** The program with no command: help on stderr, nothing on stdout, the usage exit code. */
import { expect, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { fakeIo } from "./fakeIo.js";

it("no arguments prints the help on stderr and exits 1", async () => {
  const { io, stdout, stderr } = fakeIo();
  expect(await run([], io)).toBe(exitCodes.usage);
  expect(stdout()).toBe("");
  expect(stderr()).toMatch(/^Usage: betabound \[options\] \[command\]/);
  expect(stderr()).toMatch(/solve \[options\] \[files\.\.\.\]/);
});

it("--help is asked for: the help on stdout, exit 0", async () => {
  const { io, stdout } = fakeIo();
  expect(await run(["--help"], io)).toBe(exitCodes.ok);
  expect(stdout()).toMatch(/^Usage: betabound/);
});
