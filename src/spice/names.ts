/**
 * SPICE node names for netlist nets: letters, digits and _ only (a `.` would read as a
 * subcircuit path), never a name the testbench itself uses, and unique.
 */
const RESERVED = new Set(['0', 'gnd', 'vdd', 'clk_src']);

export function spiceNodeNames(nets: readonly string[]): Map<string, string> {
  const out = new Map<string, string>();
  const used = new Set<string>();
  for (const net of nets) {
    let base = net.replace(/[^A-Za-z0-9_]/g, '_').toLowerCase();
    if (!/^[a-z_]/.test(base) || RESERVED.has(base)) base = `n_${base}`;
    let name = base;
    for (let k = 2; used.has(name); k++) name = `${base}_${k}`;
    used.add(name);
    out.set(net, name);
  }
  return out;
}

/** A number in SPICE notation with enough digits for timing work (no unit letters: 1e-9, not 1n). */
export function spiceNumber(value: number): string {
  if (value === 0) return '0';
  const rounded = Number(value.toPrecision(6));
  const magnitude = Math.abs(rounded);
  if (magnitude >= 1e-3 && magnitude < 1e4) return String(rounded);
  return rounded.toExponential().replace('e+', 'e');
}
