/** `betabound schema NAME`: the JSON Schema of a command's JSON output, generated from the zod schemas. */
import { Argument, Command } from "commander";
import { outputNames } from "../../schema/outputNames.js";
import { exitCodes, type ExitCode } from "../runtime/exitCodes.js";
import type { CliIo } from "../runtime/io.js";

export function schemaCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  return new Command("schema")
    .description("Print the JSON Schema of an output: solve (--format json), solve-record (one jsonl line), implied, roll-record.")
    .addArgument(new Argument("<name>", "which output").choices(outputNames))
    .addHelpText("after", "\nExamples:\n  $ betabound schema solve > solve.schema.json\n  $ betabound schema solve-record\n")
    .action(async (name: (typeof outputNames)[number]) => {
      // The output schemas are built only when asked for: plain runs never pay for them.
      const { outputJsonSchema } = await import("../../schema/outputs.js");
      io.writeOut(`${JSON.stringify(outputJsonSchema(name), null, 2)}\n`);
      setExit(exitCodes.ok);
    });
}
