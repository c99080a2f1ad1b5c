// Text on its way to a terminal. Two kinds of special characters meet there and must not be
// confused: control characters in user text (a case or storm name holding "\u001b[2J" must not drive
// the terminal: it is shown escaped), and outfit's own styling (bold headings, a green "pass"). So
// outfit's styling travels through the reports as marker characters (Unicode noncharacters, which
// text interchanged between programs does not hold), never as control characters; only at the
// terminal, after the user's control characters are escaped, are the markers turned into SGR colour
// codes, and only where colour is allowed (a terminal, no NO_COLOR, no TERM=dumb). Everywhere else
// (pipes, files) they are removed.
import stringWidth from "string-width";

export type Tone = "pass" | "fail" | "strong" | "muted";

/** The SGR codes outfit uses, each with its marker (U+FDD0 onwards). */
const SGR_CODES = [1, 2, 22, 31, 32, 39] as const;
type Sgr = (typeof SGR_CODES)[number];
const MARKER: Record<Sgr, string> = Object.fromEntries(SGR_CODES.map((code, i) => [code, String.fromCharCode(0xfdd0 + i)])) as Record<Sgr, string>;
const CODE_OF_MARKER = new Map(SGR_CODES.map((code) => [MARKER[code], code]));
const MARKERS = /[\uFDD0-\uFDD5]/g;

/** Each tone's codes on and off (one parameter per code, so a table library that carries colour across wrapped lines knows them all). */
const TONES: Record<Tone, [Sgr[], Sgr[]]> = {
  pass: [[32], [39]],
  fail: [[31, 1], [22, 39]],
  strong: [[1], [22]],
  muted: [[2], [22]],
};

/** Text in a tone, as markers (they take no room and become colour only at a colour terminal). */
export function styled(tone: Tone, text: string): string {
  if (text === "") return text;
  const [on, off] = TONES[tone];
  return `${on.map((c) => MARKER[c]).join("")}${text}${off.map((c) => MARKER[c]).join("")}`;
}

/** The text without outfit's styling. */
export function withoutStyle(text: string): string {
  return text.replace(MARKERS, "");
}

/** Text with control characters (ANSI escapes, carriage returns, bells...) shown escaped (`\u001b`),
 * so a case or storm name cannot drive the terminal; newlines and tabs stay. */
export function terminalSafe(text: string): string {
  // eslint-disable-next-line no-control-regex
  return text.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u2028\u2029]/g, (ch) => `\\u${ch.charCodeAt(0).toString(16).padStart(4, "0")}`);
}

/** Styling markers as SGR codes (what a table library that knows colour codes is given). */
export function styleAsAnsi(text: string): string {
  return text.replace(MARKERS, (m) => `\u001b[${CODE_OF_MARKER.get(m)}m`);
}

/** SGR codes of outfit's set back to markers (text whose only escapes are outfit's own, as a table library returns it). */
export function ansiAsStyle(text: string): string {
  // eslint-disable-next-line no-control-regex
  return text.replace(/\u001b\[(\d+)m/g, (whole, code: string) => MARKER[Number(code) as Sgr] ?? whole);
}

/** What the terminal is sent: the user's control characters escaped, then outfit's styling as colour codes (or removed). */
export function forTerminal(text: string, colour: boolean): string {
  const safe = terminalSafe(text);
  return colour ? styleAsAnsi(safe) : withoutStyle(safe);
}

/** Cells the text takes on a terminal, once printed: styling takes none, an escaped control
 * character its escape's, a wide character (CJK, most emoji) two (string-width, Unicode's East
 * Asian Width and emoji properties). The widest line when the text has several. */
export function visibleWidth(text: string): number {
  let widest = 0;
  for (const line of terminalSafe(withoutStyle(text)).split("\n")) widest = Math.max(widest, stringWidth(line));
  return widest;
}

/** Colour only on a terminal, never with NO_COLOR (https://no-color.org: any non-empty value) or TERM=dumb. */
export function colourAllowed(stream: { isTTY?: boolean }, env: NodeJS.ProcessEnv = process.env): boolean {
  return stream.isTTY === true && !(env.NO_COLOR !== undefined && env.NO_COLOR !== "") && env.TERM !== "dumb";
}

/** The width of a stream for prose: COLUMNS when set to a number, else the terminal's; null when piped. */
export function streamWidth(stream: { isTTY?: boolean; columns?: number }, env: NodeJS.ProcessEnv = process.env): number | null {
  const fromEnv = env.COLUMNS !== undefined && /^\s*\d+\s*$/.test(env.COLUMNS) ? Number(env.COLUMNS) : null;
  const fromTerminal = stream.isTTY && stream.columns ? stream.columns : null;
  return fromEnv ?? fromTerminal;
}
