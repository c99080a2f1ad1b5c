// design (and design --size-pond where a case has a site) under a real pseudo-terminal at 80 and 120
// columns on every bundled case with a catalogue: no literal escape text, no stray control
// character, no line wider than the terminal, colour as colour (see pseudoTerminal.test.ts).
import { describe, expect, it } from "vitest";
import { checkAtWidth, haveScript } from "./pseudoTerminal.js";
import { designCommands, WIDTHS } from "./terminalCommands.js";

describe.skipIf(!haveScript())("design under a pseudo-terminal", () => {
  for (const columns of WIDTHS) {
    it.each(designCommands().map((c) => [c.label, c] as const))(`%s at ${columns} columns`, (_label, command) => {
      expect(checkAtWidth(command, columns).problems).toEqual([]);
    }, 180_000);
  }
});
