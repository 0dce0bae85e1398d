import { describe, expect, it } from 'vitest';
import { readVcdStrict } from './vcd-parser.js';
import { renderVcd } from '../../src/render/vcd/vcd.js';

const good = renderVcd({
  top: 'gen',
  comment: 'a comment with $dumpvars in it',
  version: 'v',
  timescale: '1fs',
  end: 4e-12,
  signals: [
    { scope: [], name: 'p1', initial: 0, changes: [{ time: 1e-12, value: 1 }] },
    { scope: ['internal'], name: 'x', initial: 1, changes: [] },
  ],
});

describe('readVcdStrict', () => {
  it("reads the renderer's own file without problems and lists its references", () => {
    expect(readVcdStrict(good)).toEqual({ problems: [], vars: ['gen.p1', 'gen.internal.x'] });
  });
  it('rejects a comment closed early by user text', () => {
    const text =
      '$comment x $end y $end\n$timescale 1 fs $end\n$scope module a $end\n$var wire 1 ! p $end\n$upscope $end\n$enddefinitions $end\n#0\n1!\n';
    expect(readVcdStrict(text).problems).toEqual(['unexpected token in the header: "y"']);
  });
  it('rejects a reference with a space, and stops at the first problem', () => {
    expect(
      readVcdStrict('$timescale 1 fs $end\n$scope module a $end\n$var wire 1 ! p q r $end\n$upscope $end\n$enddefinitions $end\n#0\n1!\n')
        .problems,
    ).toEqual(['bad $var "wire 1 ! p q r"']);
  });
});
