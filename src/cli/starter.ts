/** The commented starter design written by `phasegap init`; it passes `phasegap check` as written. */

const PROCESS = `# An INVENTED generic 1.8 V process, inline so this file runs anywhere. Replace it with
# your own card (a path, e.g. process: ../cards/myprocess.yaml) before trusting any number.
process:
  name: starter-generic180
  description: Invented generic 1.8 V process (demo data, not any foundry's)
  t0: 27                 # degC at which vth0 and drive are given
  lmin: 0.18um
  vddNominal: 1.8V
  unit: { wn: 0.5um, wp: 1.0um }   # the size-1 inverter
  n: { vth0: 0.45V, alpha: 1.3, drive: 287, vthTempco: 1mV, mobilityExponent: 1.5,
       gamma: 0.45, phi2f: 0.85V, cgate: 1.6e-9, cdrain: 1.0e-9, avt: 5e-9, kprime: 300e-6,
       subthresholdN: 1.5,                           # sub-threshold slope factor (S = n kT/q ln 10)
       ratings: { vgs: 2.2V, vds: 2.2V, vgb: 2.2V } }  # invented voltage ratings of a 1.8 V device
  p: { vth0: 0.45V, alpha: 1.4, drive: 128, vthTempco: 1mV, mobilityExponent: 1.4,
       gamma: 0.4, phi2f: 0.85V, cgate: 1.6e-9, cdrain: 1.0e-9, avt: 5.5e-9, kprime: 70e-6,
       subthresholdN: 1.5, ratings: { vgs: 2.2V, vds: 2.2V, vgb: 2.2V } }
  corners:               # Vth shift (V) and drive multiplier per device type
    tt: {}
    ss: { n: { dvth: 60mV, drive: 0.85 }, p: { dvth: 60mV, drive: 0.85 } }
    ff: { n: { dvth: -60mV, drive: 1.15 }, p: { dvth: -60mV, drive: 1.15 } }
    fs: { n: { dvth: -60mV, drive: 1.15 }, p: { dvth: 60mV, drive: 0.85 } }
    sf: { n: { dvth: 60mV, drive: 0.85 }, p: { dvth: -60mV, drive: 1.15 } }`;

const GENERATORS = {
  nand: `generator:
  template: nand         # cross-coupled NAND2 pair; phases are active high
  phases: [p1, p2]       # p1 is active while the input clock is high
  gateSize: 2            # size of the NAND2 gates (1 = unit inverter drive)
  stages: 6              # inverters per feedback chain (even)
  stageSize: 1           # one size for all stages, or a list: [1, 1, 2, 2, 1, 1]
  stageLoad: 40fF        # delay capacitor on every chain node
  buffer: [2, 6, 18]     # tapered output buffer per phase (odd count for nand)
  complementary: false   # true adds p1b/p2b for transmission gates
  earlyTap: 0            # e.g. 2 adds early phases p1e/p2e for bottom-plate sampling`,
  nor: `generator:
  template: nor          # cross-coupled NOR2 pair; phases are active high
  phases: [p1, p2]       # p1 is active while the input clock is high
  gateSize: 2            # size of the NOR2 gates (1 = unit inverter drive)
  stages: 6              # inverters per feedback chain (even)
  stageSize: 1           # one size for all stages, or a list: [1, 1, 2, 2, 1, 1]
  stageLoad: 40fF        # delay capacitor on every chain node
  buffer: [3, 18]        # tapered output buffer per phase (even count for nor)
  complementary: false   # true adds p1b/p2b for transmission gates
  earlyTap: 0            # e.g. 2 adds early phases p1e/p2e for bottom-plate sampling`,
} as const;

export type StarterTemplate = keyof typeof GENERATORS;

export function starterDesign(template: StarterTemplate): string {
  return `# phasegap starter design (${template} style). Check it with: phasegap check <this file>
# Quantities take SI prefixes ("20MHz", "85ps", "4.7pF", "0.18um") or plain SI numbers.
# Editors can autocomplete this file from: phasegap schema > phasegap.schema.json
name: starter-${template}
description: Starter two-phase non-overlapping clock (edit me)

${PROCESS}

clock:
  frequency: 20MHz
  duty: 0.5              # fraction of the period the input clock is high
  dutyTolerance: 0.02    # +/- duty error; widths are checked at the worst duty
  transition: 200ps      # input clock edge time (full swing)

${GENERATORS[template]}

loads:                   # extra capacitance on named nets (switch gates, wiring)
  p1: 0.8pF
  p2: 0.8pF

corners:                 # every combination is a corner, named like ss/1.62V/125C
  process: [tt, ss, ff, fs, sf]
  vdd: [1.62V, 1.8V, 1.98V]
  temperature: [-40, 27, 125]

nodes:                   # every circuit node a switch connects: its voltage while p1 is active,
                         # while p2 is, and in the dead time (default: either), as a level or {min, max}
  vin: { min: 0.2V, max: 0.7V }                           # the input range, the same in every phase
  cs: { phase1: { min: 0.2V, max: 0.7V }, phase2: 0.6V }  # sampling capacitor: the input, then the reference

switches:                # each connects two nodes (or a node and a rail level such as 0.6V, vdd, 0V)
  - { name: s_in, type: nmos, w: 10um, l: 0.18um, gate: p1, terminals: [vin, cs] }
  - { name: s_ref, type: nmos, w: 10um, l: 0.18um, gate: p2, terminals: [cs, 0.6V] }

constraints:
  breakBeforeMake:       # never both on: the input would be shorted to the reference
    - { between: [s_in, s_ref] }     # guard: 200ps here overrides requirements.guard (optional)
  settle:                # optional: the sampling capacitor must settle through s_in while p1 is active
    - { name: cs sampling, switches: [s_in], capacitance: 2pF, bits: 10 }   # or error: 0.001
  # order:               # optional: one switch event before another, e.g. bottom-plate sampling
  #   - { first: { switch: s_ref, event: off }, then: { switch: s_in, event: on }, min: 100ps }

requirements:
  deadTime: { min: 500ps, max: 4ns }   # at the 50 % points, both handovers
  width: { min: 20ns }                 # each phase's active width
  guard: 100ps                         # break-before-make guard at the switches
  offDecades: 2                        # an off switch keeps 2 decades of current below its threshold
`;
}
