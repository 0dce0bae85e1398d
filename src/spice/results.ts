/**
 * Reading ngspice's batch output: every `.meas` prints `name = value` (with targ/trig for an
 * interval), or reports that it failed. Names come back in lower case.
 */

export interface SimulatorOutput {
  /** Measured value of each measurement, s; null when ngspice could not measure it. */
  readonly values: ReadonlyMap<string, number | null>;
  /** Lines that report an error, for the user. */
  readonly errors: readonly string[];
}

const VALUE = /^\s*([a-z_][a-z0-9_]*)\s*=\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)(?:\s|$)/;
const FAILED = /^\s*([a-z_][a-z0-9_]*)\s*=\s*failed/i;
const MEAS_ERROR = /^\s*error:\s*measure\s+([a-z_][a-z0-9_]*)\b/i;
const MEAS_FAILED = /^\s*\.meas\w*\s+\w+\s+([a-z_][a-z0-9_]*)\b.*\bfailed!?\s*$/i;

export function parseSimulatorOutput(text: string, expected: readonly string[]): SimulatorOutput {
  const wanted = new Set(expected.map((n) => n.toLowerCase()));
  const values = new Map<string, number | null>();
  const errors: string[] = [];
  for (const line of text.split(/\r?\n/)) {
    const value = VALUE.exec(line);
    if (value && wanted.has(value[1]!)) {
      values.set(value[1]!, Number(value[2]));
      continue;
    }
    const failed = FAILED.exec(line) ?? MEAS_ERROR.exec(line) ?? MEAS_FAILED.exec(line);
    if (failed && wanted.has(failed[1]!.toLowerCase())) {
      if (!values.has(failed[1]!.toLowerCase())) values.set(failed[1]!.toLowerCase(), null);
      continue;
    }
    if (/^\s*(error|fatal)\b/i.test(line) || /\berror:/i.test(line)) errors.push(line.trim());
  }
  for (const name of wanted) if (!values.has(name)) values.set(name, null);
  return { values, errors };
}
