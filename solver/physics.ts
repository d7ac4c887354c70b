/**
 * Physical constants and the thermal voltage. k and q are exact since the 2019 redefinition of the
 * SI (SI Brochure, 9th ed., 2019).
 */

/** Boltzmann constant, J/K (exact). */
export const BOLTZMANN = 1.380649e-23;
/** Elementary charge, C (exact). */
export const ELEMENTARY_CHARGE = 1.602176634e-19;
/** 0 °C in kelvin. */
export const ZERO_CELSIUS = 273.15;
/** The default temperature, 27 °C. */
export const DEFAULT_KELVIN = 300.15;

/** Thermal voltage kT/q in volts. */
export function thermalVoltage(kelvin: number): number {
  return (BOLTZMANN * kelvin) / ELEMENTARY_CHARGE;
}
