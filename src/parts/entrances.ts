// Barrel entrances: each name the case format accepts, with its FHWA HDS-5 inlet-control row and its
// entrance loss coefficient ke, in one table.
// Sources:
// - K, M, c, Y, Ks and the equation form: HDS-5 (FHWA-NHI-01-020, 2nd ed. 2001) App. A Table 9 and
//   HDS-5 (FHWA-HIF-12-026, 3rd ed. 2012) Table A.1, which agree on these rows. Ks is -0.5 for every
//   row except the mitered corrugated metal pipe (+0.7), 3rd ed. Table A.1.
// - ke: HDS-5 2nd ed. Table 12 / 3rd ed. Table C.2 (entrance loss coefficients, outlet control, full
//   or partly full entrance).
import { own } from "../own.js";

/** The entrance names the case format accepts (case-format contract). */
export const ENTRANCES = [
  "concrete-square-headwall",
  "concrete-groove-headwall",
  "concrete-groove-projecting",
  "cmp-headwall",
  "cmp-mitered",
  "cmp-projecting",
  "box-wingwall-30-75",
  "box-wingwall-15-90",
] as const;

export type EntranceName = (typeof ENTRANCES)[number];

export interface Entrance {
  /** The barrel shape the row was measured on. */
  shape: "circular" | "box";
  /** HDS-5 unsubmerged form: 1 uses the critical specific head, 2 does not. */
  form: 1 | 2;
  /** Unsubmerged constants K and M (US units in Q/(A D^0.5)). */
  K: number;
  M: number;
  /** Submerged constants c and Y (US units in Q/(A D^0.5)). */
  c: number;
  Y: number;
  /** Slope correction: HW/D gains Ks * S. */
  Ks: number;
  /** Entrance loss coefficient for outlet control. */
  ke: number;
  /** The rows as the handbooks name them. */
  inletRow: string;
  lossRow: string;
}

export const ENTRANCE_TABLE: Readonly<Record<EntranceName, Entrance>> = {
  "concrete-square-headwall": {
    shape: "circular", form: 1, K: 0.0098, M: 2.0, c: 0.0398, Y: 0.67, Ks: -0.5, ke: 0.5,
    inletRow: "circular concrete, square edge with headwall",
    lossRow: "concrete pipe, headwall or headwall and wingwalls, square-edge",
  },
  "concrete-groove-headwall": {
    shape: "circular", form: 1, K: 0.0018, M: 2.0, c: 0.0292, Y: 0.74, Ks: -0.5, ke: 0.2,
    inletRow: "circular concrete, groove end with headwall",
    lossRow: "concrete pipe, headwall, socket end of pipe (groove end)",
  },
  "concrete-groove-projecting": {
    shape: "circular", form: 1, K: 0.0045, M: 2.0, c: 0.0317, Y: 0.69, Ks: -0.5, ke: 0.2,
    inletRow: "circular concrete, groove end projecting",
    lossRow: "concrete pipe projecting from fill, socket end (groove end)",
  },
  "cmp-headwall": {
    shape: "circular", form: 1, K: 0.0078, M: 2.0, c: 0.0379, Y: 0.69, Ks: -0.5, ke: 0.5,
    inletRow: "circular corrugated metal, headwall",
    lossRow: "corrugated metal pipe, headwall or headwall and wingwalls, square-edge",
  },
  "cmp-mitered": {
    shape: "circular", form: 1, K: 0.021, M: 1.33, c: 0.0463, Y: 0.75, Ks: 0.7, ke: 0.7,
    inletRow: "circular corrugated metal, mitered to slope",
    lossRow: "corrugated metal pipe, mitered to conform to fill slope",
  },
  "cmp-projecting": {
    shape: "circular", form: 1, K: 0.034, M: 1.5, c: 0.0553, Y: 0.54, Ks: -0.5, ke: 0.9,
    inletRow: "circular corrugated metal, projecting",
    lossRow: "corrugated metal pipe, projecting from fill (no headwall)",
  },
  "box-wingwall-30-75": {
    shape: "box", form: 1, K: 0.026, M: 1.0, c: 0.0347, Y: 0.81, Ks: -0.5, ke: 0.4,
    inletRow: "rectangular concrete box, 30 to 75 degree wingwall flares",
    lossRow: "reinforced concrete box, wingwalls at 30 to 75 degrees to barrel, square-edged at crown",
  },
  "box-wingwall-15-90": {
    shape: "box", form: 1, K: 0.061, M: 0.75, c: 0.04, Y: 0.8, Ks: -0.5, ke: 0.5,
    inletRow: "rectangular concrete box, 90 and 15 degree wingwall flares",
    lossRow: "reinforced concrete box, headwall parallel to embankment (90 degrees) or wingwalls at 10 to 25 degrees, square-edged",
  },
};

/** The entrance row of a barrel; the schema admits only the names of the table. */
export function entrance(name: string): Entrance {
  const row = own(ENTRANCE_TABLE as Record<string, Entrance>, name);
  if (!row) throw new Error(`unknown barrel entrance "${name}"`);
  return row;
}

/** The entrance names that fit a barrel shape. */
export function entrancesFor(shape: "circular" | "box"): EntranceName[] {
  return (Object.keys(ENTRANCE_TABLE) as EntranceName[]).filter((name) => ENTRANCE_TABLE[name].shape === shape);
}
