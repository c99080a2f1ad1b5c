// The openings of the riser or headwall (the outlet's elements: orifices, weirs, regulators) and the
// riser's rim: the flow in through them for a pond stage and a downstream level (the chamber, or
// tailwater without a barrel), each part submerged by that level as the case-format contract states.
// Each element's flow is its kind's (src/parts/).
import type { Element, Outlet } from "../model.js";
import { bottomOf, partOf, type AnyElementPart } from "../parts/registry.js";
import { rimDischarge } from "../parts/riser.js";

export function elementFlow(e: Element, ws: number, ds: number): number {
  return partOf(e).flow(e, ws, ds);
}

/**
 * Each outlet's element kinds, looked up once per elements list (the code makes new outlets rather than
 * change one's elements in place): the direct evaluation's hot path, where looking each kind up per
 * call took about a fifth of its time (DEVELOPERS.md, "Parts").
 */
const kindsOf = new WeakMap<readonly Element[], AnyElementPart[]>();

function kinds(elements: readonly Element[]): AnyElementPart[] {
  let found = kindsOf.get(elements);
  if (found === undefined || found.length !== elements.length) {
    found = elements.map((e) => partOf(e));
    kindsOf.set(elements, found);
  }
  return found;
}

/** Flow in through every opening and the rim for a downstream (chamber or tailwater) level. */
export function openingsFlow(outlet: Outlet, ws: number, ds: number): number {
  let q = 0;
  const elements = outlet.elements;
  const kind = kinds(elements);
  for (let i = 0; i < elements.length; i++) q += kind[i].flow(elements[i], ws, ds);
  if (outlet.riser) q += rimDischarge(outlet.riser, ws, ds);
  return q;
}

/** The lowest level at which a downstream level starts to reduce the flow through some opening or the rim. */
export function lowestOpening(outlet: Outlet): number {
  let lowest = outlet.riser ? outlet.riser.crest : Infinity;
  const elements = outlet.elements;
  for (let i = 0; i < elements.length; i++) {
    const bottom = bottomOf(elements[i]);
    if (bottom < lowest) lowest = bottom;
  }
  return lowest;
}
