/**
 * The temperature law of SPICE's level 1-3 MOSFETs for the surface potential 2 phi_F and the
 * threshold, as ngspice applies it to a model file's PHI and VTO given at TNOM (the SPICE2/3
 * update through the silicon band gap, E_g(T) = 1.16 - 7.02e-4 T^2 / (T + 1108) eV, written from
 * memory of the SPICE3 MOS temperature code and checked against ngspice-39 below). With
 * v_t = kT/q, T_r = 300.15 K and
 *   p(T) = -2 v_t (1.5 ln(T / T_r) - E_g(T) / (2 v_t) + E_g(T_r) / (2 kT_r/q)),
 *   2 phi_F(T) = (T / T_r) (2 phi_F(T_0) - p(T_0)) / (T_0 / T_r) + p(T);
 * the threshold magnitude moves by gamma (sqrt(2 phi_F(T)) - sqrt(2 phi_F(T_0))) + (2 phi_F(T) -
 * 2 phi_F(T_0)) / 2, plus (E_g(T_0) - E_g(T)) / 2 for an n device and minus it for a p device.
 * On generic180's level-3 models (gamma 0.45 / 0.4, PHI 0.7 V at 27 C) ngspice-39 reports
 * (@m[von]) thresholds of 0.5360 / 0.3114 V (n) and 0.5489 / 0.2887 V (p) at -40 / 125 C, and
 * 0.1650 / 0.1941 V of body effect at V_SB = 0.8 V (n); this law gives the same to 0.2 mV.
 */
import type { DeviceType } from '../schema/process.js';
import { K_OVER_Q, KELVIN } from './thermal.js';

/** SPICE's reference temperature, K. */
const REFERENCE = 300.15;

/** Band gap of silicon at T kelvin, eV (SPICE's fit). */
function bandGap(kelvin: number): number {
  return 1.16 - (7.02e-4 * kelvin * kelvin) / (kelvin + 1108);
}

/** SPICE's band-gap term of the surface potential at T kelvin, V. */
function gapTerm(kelvin: number): number {
  const vt = K_OVER_Q * kelvin;
  return -2 * vt * (1.5 * Math.log(kelvin / REFERENCE) - bandGap(kelvin) / (2 * vt) + bandGap(REFERENCE) / (2 * K_OVER_Q * REFERENCE));
}

/**
 * 2 phi_F at `celsius`, given `phi2f` at the card's `t0` (both C), V. A small 2 phi_F (a lightly
 * doped body) reaches zero and below when hot: the body is then near intrinsic, and 2 phi_F is held
 * at four thermal voltages rather than let the threshold's square roots fail.
 */
export function surfacePotentialAt(phi2f: number, t0: number, celsius: number): number {
  const nominal = t0 + KELVIN;
  const kelvin = celsius + KELVIN;
  const atReference = (phi2f - gapTerm(nominal)) / (nominal / REFERENCE);
  return Math.max((kelvin / REFERENCE) * atReference + gapTerm(kelvin), 4 * K_OVER_Q * kelvin);
}

/** How far the threshold magnitude moves from `t0` to `celsius` under SPICE's level 1-3 law, V. */
export function spiceThresholdShift(type: DeviceType, gamma: number, phi2f: number, t0: number, celsius: number): number {
  const phi = surfacePotentialAt(phi2f, t0, celsius);
  const gap = (bandGap(t0 + KELVIN) - bandGap(celsius + KELVIN)) / 2;
  return gamma * (Math.sqrt(phi) - Math.sqrt(phi2f)) + (phi - phi2f) / 2 + (type === 'n' ? gap : -gap);
}
