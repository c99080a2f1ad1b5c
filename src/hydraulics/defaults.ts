// Default coefficients, in the units of the case that uses them (the case-format contract's table).
import type { UnitSystem } from "../units.js";

export interface DefaultCoefficients {
  /** Orifice discharge coefficient, sharp-edged opening: 0.61 (USBR Water Measurement Manual; HEC-22 sec. 8.4.4.1 gives 0.6). */
  orifice: number;
  /** Francis rectangular weir: 3.33 ft^0.5/s, 1.84 m^0.5/s (HEC-22 eq 8-19, H/Hc < 0.3). */
  rectangularWeir: number;
  /** V-notch weir Q = C tan(angle/2) H^2.5: 2.50 US, 1.38 SI (HEC-22 eq 8-23). */
  vNotchWeir: number;
  /** Riser rim as a weir over its perimeter: 3.0 US, 1.66 SI (the contract's default). */
  riserWeir: number;
  /** Riser top opening as an orifice: 0.60 (HEC-22 Example 8-6). */
  riserOrifice: number;
  /** Broad-crested trapezoidal spillway: 2.8 US, 1.55 SI (HEC-22 Table 8-1 range, Brater & King). */
  spillway: number;
}

export function defaultCoefficients(units: UnitSystem): DefaultCoefficients {
  return units === "US"
    ? { orifice: 0.61, rectangularWeir: 3.33, vNotchWeir: 2.5, riserWeir: 3.0, riserOrifice: 0.6, spillway: 2.8 }
    : { orifice: 0.61, rectangularWeir: 1.84, vNotchWeir: 1.38, riserWeir: 1.66, riserOrifice: 0.6, spillway: 1.55 };
}
