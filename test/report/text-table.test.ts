import { describe, expect, it } from 'vitest';
import { left, renderTable, right } from '../../src/report/text-table.js';

describe('renderTable', () => {
  it('pads left columns on the right and right columns on the left to the widest cell, header included', () => {
    const text = renderTable(
      [left('corner'), right('dead ps')],
      [
        ['tt', '1719'],
        ['ss/1.62V/125C', '3185'],
      ],
    );
    expect(text).toBe(['corner         dead ps', '-------------  -------', 'tt                1719', 'ss/1.62V/125C     3185'].join('\n'));
  });

  it('left() and right() declare the column alignment', () => {
    expect(left('check')).toEqual({ header: 'check', align: 'left' });
    expect(right('margin')).toEqual({ header: 'margin', align: 'right' });
  });

  it('trims the trailing blanks of a short last cell', () => {
    expect(renderTable([left('a'), left('verdict')], [['x', 'ok']]).split('\n')[2]).toBe('x  ok');
  });
});
