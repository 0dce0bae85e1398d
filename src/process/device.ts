/**
 * A device type evaluated at a corner: threshold and drive after the process shift, the supply
 * and the temperature.
 *
 * Drive follows the alpha-power law (T. Sakurai, A. R. Newton, IEEE JSSC 25(2):584-594, 1990):
 *   I_D0 = W * K * (T/T0)^-m * (V_DD - Vth(T))^alpha,  Vth(T) = vth0 + dvth - kappa * (T - T0).
 * Temperature inversion is not special-cased: it emerges where the threshold term outweighs the
 * mobility term at small overdrive.
 */
import { inputError } from '../errors.js';
import type { DeviceParams, DeviceType, ProcessCard } from '../schema/process.js';
import type { Corner } from './corner.js';
import { spiceThresholdShift, surfacePotentialAt } from './spice-temperature.js';
import { KELVIN } from './thermal.js';

export interface DeviceAtCorner {
  readonly type: DeviceType;
  /** Threshold magnitude at this corner, V (before any body effect or mismatch). */
  readonly vth: number;
  /** Velocity-saturation index. */
  readonly alpha: number;
  /**
   * Drain saturation voltage at full drive over the overdrive (the card's vdsatRatio; alpha - 1,
   * Toh, Ko and Meyer's velocity-saturation value, when the card gives none).
   */
  readonly saturation: number;
  /** Saturation current per metre of width at V_GS = V_DS = V_DD, A/m. */
  readonly idsatPerWidth: number;
  /** Drive constant at this corner and temperature, A/m/V^alpha (current = W * k * overdrive^alpha). */
  readonly driveConstant: number;
  /** Triode mu*Cox scaled for temperature and the corner's drive, A/V^2. */
  readonly kprime: number;
  /**
   * Threshold magnitude of the device as a switch sees it (turn-on level, on-resistance, off- and
   * on-state bias), V: the card's triode temperature law, vth0 + dvth - triode.vthTempco * (T - t0)
   * or SPICE's level 1-3 law (spice-temperature.ts), which is the transistor's own threshold drift;
   * `vth` is the alpha-power fit's, a parameter of the saturation current that may drift otherwise.
   * Equal to `vth` without a `triode` section.
   */
  readonly switchVth: number;
  /** Mobility degradation theta, 1/V (the card's, or derived by `derivedTheta`). */
  readonly theta: number;
  /** Body-effect coefficient, V^0.5, and surface potential 2 phi_F at this temperature (surfacePotentialAt), V. */
  readonly gamma: number;
  readonly phi2f: number;
  /** Capacitances per metre of width, F/m. */
  readonly cgate: number;
  readonly cdrain: number;
  /** The card's raw parameters. */
  readonly params: DeviceParams;
}

export interface CornerDevices {
  readonly corner: Corner;
  readonly vdd: number;
  readonly n: DeviceAtCorner;
  readonly p: DeviceAtCorner;
  readonly card: ProcessCard;
}

/** Threshold magnitude at a temperature, V. */
export function thresholdAt(params: DeviceParams, dvth: number, celsius: number, t0: number): number {
  return params.vth0 + dvth - params.vthTempco * (celsius - t0);
}

/** Drive scale from mobility, (T/T0)^-m with temperatures in kelvin. */
export function mobilityScale(params: Pick<DeviceParams, 'mobilityExponent'>, celsius: number, t0: number): number {
  return ((celsius + KELVIN) / (t0 + KELVIN)) ** -params.mobilityExponent;
}

/** Alpha-power saturation current per metre of width at a given gate overdrive, A/m; 0 below threshold. */
export function saturationCurrent(driveConstant: number, alpha: number, overdrive: number): number {
  return overdrive > 0 ? driveConstant * overdrive ** alpha : 0;
}

/** Below this |u| the series of (1 - u)^alpha is used; its truncation error is then below 1e-13. */
const SERIES_LIMIT = 0.04;

/**
 * (1 - u)^alpha, the factor by which a threshold shift of u times the overdrive scales the
 * alpha-power current. Small shifts (local mismatch) use the binomial series to the 8th power
 * instead of Math.pow: the same value to 1e-13 relative, several times faster in Monte Carlo.
 */
export function shiftFactor(u: number, alpha: number): number {
  if (!(Math.abs(u) <= SERIES_LIMIT)) return u < 1 ? (1 - u) ** alpha : 0;
  let term = 1;
  let sum = 1;
  for (let k = 1; k <= 8; k++) {
    term *= ((alpha - k + 1) / k) * -u;
    sum += term;
  }
  return sum;
}

/**
 * Mobility degradation a card implies when it gives none, 1/V: the theta for which the square law
 * with degraded mobility, I = (k'/2)(W/L) V_ov^2 / (1 + theta V_ov) (SPICE level 3's THETA form:
 * A. Vladimirescu, S. Liu, The Simulation of MOS Integrated Circuits Using SPICE2, UCB/ERL M80/7,
 * 1980, from memory), carries the card's alpha-power saturation current at minimum length and the
 * nominal supply. That current is also cut by velocity saturation, which barely acts in deep
 * triode, so this theta errs high: the on-resistance it gives is an upper estimate.
 */
export function derivedTheta(card: ProcessCard, type: DeviceType): number {
  const params = card[type];
  const overdrive = card.vddNominal - params.vth0;
  if (!(overdrive > 0)) return 0;
  const squareLaw = (params.kprime / 2 / card.lmin) * overdrive * overdrive;
  const alphaPower = saturationCurrent(params.drive, params.alpha, overdrive);
  return Math.max(0, (squareLaw / alphaPower - 1) / overdrive);
}

/** The card's process corner of that name, looked up among the card's own corners only. */
export function processCornerOf(card: ProcessCard, name: string): ProcessCard['corners'][string] | undefined {
  return Object.hasOwn(card.corners, name) ? card.corners[name] : undefined;
}

/**
 * The threshold magnitude a switch sees at a temperature, V: vth0 + dvth moved by the card's triode
 * law (a fall per kelvin, or SPICE's level 1-3 law), the alpha-power fit's own drift without one.
 */
function switchThreshold(params: DeviceParams, type: DeviceType, dvth: number, celsius: number, t0: number): number {
  const law = params.triode?.vthTempco ?? params.vthTempco;
  const shift = law === 'spice' ? spiceThresholdShift(type, params.gamma, params.phi2f, t0, celsius) : -law * (celsius - t0);
  return params.vth0 + dvth + shift;
}

export function deviceAtCorner(card: ProcessCard, type: DeviceType, corner: Corner): DeviceAtCorner {
  const params = card[type];
  const shift = processCornerOf(card, corner.process)?.[type];
  if (!shift) {
    throw inputError(
      'reference.unknown',
      ['corners', 'process'],
      corner.process,
      `is not a process corner of card "${card.name}"; it defines ${Object.keys(card.corners).join(', ')}`,
    );
  }
  const vth = thresholdAt(params, shift.dvth, corner.temperature, card.t0);
  const temperatureScale = mobilityScale(params, corner.temperature, card.t0);
  const driveConstant = params.drive * shift.drive * temperatureScale;
  if (!(corner.vdd > vth)) {
    throw inputError(
      'physics.device-off',
      ['corners'],
      `${corner.vdd} V`,
      `is not above the ${type}-device threshold at ${corner.name} (${vth.toFixed(3)} V): the device cannot turn on; raise the supply or drop this corner`,
    );
  }
  return {
    type,
    vth,
    alpha: params.alpha,
    saturation: params.vdsatRatio ?? params.alpha - 1,
    idsatPerWidth: saturationCurrent(driveConstant, params.alpha, corner.vdd - vth),
    driveConstant,
    kprime:
      params.kprime *
      shift.drive *
      mobilityScale({ mobilityExponent: params.triode?.mobilityExponent ?? params.mobilityExponent }, corner.temperature, card.t0),
    switchVth: switchThreshold(params, type, shift.dvth, corner.temperature, card.t0),
    theta: params.theta ?? derivedTheta(card, type),
    gamma: params.gamma,
    phi2f: surfacePotentialAt(params.phi2f, card.t0, corner.temperature),
    cgate: params.cgate,
    cdrain: params.cdrain,
    params,
  };
}

export function devicesAtCorner(card: ProcessCard, corner: Corner): CornerDevices {
  return { corner, vdd: corner.vdd, n: deviceAtCorner(card, 'n', corner), p: deviceAtCorner(card, 'p', corner), card };
}
