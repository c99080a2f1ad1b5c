// Every command under a real pseudo-terminal at 80 and 120 columns, on every bundled case: what the
// terminal shows holds no literal escape text ("\u001b[1m" printed instead of done), no control
// character but outfit's own colour codes, and no line wider than the terminal; tables and verdicts
// reach it in colour. The design runs are in pseudoTerminalDesign.test.ts.
import { describe, expect, it } from "vitest";
import { checkAtWidth, haveScript } from "./pseudoTerminal.js";
import { caseCommands, otherCommands, WIDTHS } from "./terminalCommands.js";

describe("the pseudo-terminal", () => {
  it("is available (.ci/setup-terminal installs util-linux's script from Debian's packages)", () => {
    expect(haveScript(), "util-linux's `script` is missing: run .ci/setup-terminal").toBe(true);
  });
});

describe.skipIf(!haveScript())("every command under a pseudo-terminal", () => {
  for (const columns of WIDTHS) {
    it.each(caseCommands().map((c) => [c.label, c] as const))(`%s at ${columns} columns`, (_label, command) => {
      expect(checkAtWidth(command, columns).problems).toEqual([]);
    }, 120_000);

    it.each(otherCommands().map((c) => [c.label, c] as const))(`%s at ${columns} columns`, (_label, command) => {
      expect(checkAtWidth(command, columns).problems).toEqual([]);
    }, 120_000);
  }
});
