import { describe, expect, it } from 'vitest';
import { MONTECARLO_DEFAULTS, designSchema, montecarloSettings } from '../../src/schema/design.js';
import { loadDesign } from '../../src/cli/load.js';
import { design } from '../helpers.js';

describe('montecarloSettings', () => {
  it('gives 1000 dies and seed 1 for a design without a montecarlo section', () => {
    const { design: d } = loadDesign(design('doubler'));
    expect(d.montecarlo).toBeUndefined();
    expect(montecarloSettings({ ...d, montecarlo: undefined })).toEqual({ samples: 1000, seed: 1 });
  });

  it("gives the design's own section, its missing fields filled by the schema with the same defaults", () => {
    const { design: d } = loadDesign(design('doubler'));
    expect(montecarloSettings({ ...d, montecarlo: { samples: 50, seed: 7 } })).toEqual({ samples: 50, seed: 7 });
    const section = designSchema.shape.montecarlo.parse({});
    expect(section).toEqual(MONTECARLO_DEFAULTS);
  });
});
