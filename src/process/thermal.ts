/** Absolute temperature and the thermal voltage, the two constants every temperature law here reads. */

/** 0 °C in kelvin. */
export const KELVIN = 273.15;

/** Boltzmann constant over the elementary charge, V/K (CODATA 2018: k = 1.380649e-23 J/K, q = 1.602176634e-19 C). */
export const K_OVER_Q = 1.380649e-23 / 1.602176634e-19;

/** Thermal voltage kT/q at a temperature in °C, V (25.85 mV at 300 K). */
export function thermalVoltage(celsius: number): number {
  return K_OVER_Q * (celsius + KELVIN);
}
