import { describe, expect, it } from 'vitest';
import { displayWidth, renderTable } from '../../src/io/textTable.js';
import { painter } from '../../src/io/terminalStyle.js';

describe('displayWidth', () => {
  it('counts terminal cells, not UTF-16 units', () => {
    expect(displayWidth('°C')).toBe(2);
    expect(displayWidth('m³/h')).toBe(4);
    expect(displayWidth('µm')).toBe(2);
    expect(displayWidth('e\u0301')).toBe(1); // e + combining acute accent
    expect(displayWidth('温度')).toBe(4);
    expect(displayWidth('\u001b[1;35mcritical\u001b[0m')).toBe(8);
  });
});

describe('renderTable', () => {
  it('puts units beside headers, right-aligns numbers on the decimal point and shows null as –', () => {
    const text = renderTable(
      [{ header: 'Factor' }, { header: 'Inlet air temperature', unit: '°C' }, { header: 'Total index', unit: '-' }],
      [
        ['inlet_temp', 180, 0.46],
        ['air_flow', null, 0.0125],
      ],
      { title: 'Example' },
    );
    expect(text).toBe(
      [
        'Example',
        'Factor      Inlet air temperature [°C]  Total index',
        '----------  --------------------------  -----------',
        'inlet_temp                         180       0.460',
        'air_flow                             –       0.0125',
        '',
      ].join('\n'),
    );
  });

  it('lines up non-ASCII units and coloured cells by what the terminal shows', () => {
    const paint = painter(true);
    const text = renderTable(
      [{ header: 'Flow', unit: 'm³/h' }, { header: 'Tier' }, { header: 'Note' }],
      [
        [400, paint.tier('critical'), 'X'],
        [12.5, paint.tier('negligible'), 'Y'],
      ],
    );
    const lines = text.split('\n');
    const plain = (line: string) => line.replace(/\u001b\[[0-9;]*m/g, '');
    // Every column of every line starts at the same cell.
    const noteColumn = plain(lines[0]).indexOf('Note');
    expect(plain(lines[2]).indexOf('X')).toBe(noteColumn);
    expect(plain(lines[3]).indexOf('Y')).toBe(noteColumn);
    expect(plain(lines[0]).startsWith('Flow [m³/h]')).toBe(true);
    expect(plain(lines[2])).toMatch(/^ {6}400 {4}critical/);
    expect(plain(lines[3])).toMatch(/^ {7}12\.5 {2}negligible/);
  });

  it('honours explicit alignment and a digits option, and pads short rows', () => {
    const text = renderTable([{ header: 'Name', align: 'right' }, { header: 'Value', align: 'left' }, { header: 'Extra' }], [
      ['a', 0.123456],
      ['bbb', 2],
    ], { digits: 2 });
    // Headers set the widths (Name 4, Value 5, Extra 5); an all-null column is right-aligned.
    expect(text.split('\n').slice(2, 4)).toEqual(['   a  0.12       –', ' bbb  2          –']);
  });
});
