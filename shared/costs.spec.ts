// The fuel defaults in code against the published-values table in docs/references.md: the same
// number and the same status (a value read in its source, or one recalled from memory).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { FUEL_DEFAULTS } from './costs';
import { OPERATIONS } from './operations';

function referenceRows(): Map<string, { galPerAcre: number; status: string }> {
  const text = readFileSync(join(__dirname, '..', 'docs', 'references.md'), 'utf8');
  const section = text.slice(text.indexOf('## Fuel used per acre'));
  const rows = new Map<string, { galPerAcre: number; status: string }>();
  for (const line of section.split('\n')) {
    const cells = line.split('|').map((c) => c.trim());
    if (cells.length < 6 || !/^\d/.test(cells[2])) continue;
    rows.set(cells[1], { galPerAcre: Number(cells[2]), status: cells[4] });
  }
  return rows;
}

describe('fuel used per acre, the defaults', () => {
  const rows = referenceRows();

  it('when the references table is read, then it has one row per operation', () => {
    expect([...rows.keys()].sort()).toEqual([...OPERATIONS].sort());
  });

  it.each([...OPERATIONS])('when %s has a default, then it is the number docs/references.md lists, with the same status', (op) => {
    const ref = rows.get(op)!;
    expect(FUEL_DEFAULTS[op].galPerAcre).toBe(ref.galPerAcre);
    // "read" in the references is "published" in code; "from memory" is the same in both.
    expect(FUEL_DEFAULTS[op].source.kind).toBe(ref.status === 'read' ? 'published' : ref.status);
    expect(FUEL_DEFAULTS[op].source.note.length).toBeGreaterThan(20);
  });

  // Spot checks against the sources themselves (the values read there).
  it('when the published values are checked, then they are the sources own numbers', () => {
    // University of Missouri Extension G1208 (Frisby 1993), Table 1: spike-tooth harrow 0.30, field cultivator 0.60 gal/ac.
    expect(FUEL_DEFAULTS.harrowing.galPerAcre).toBe(0.3);
    expect(FUEL_DEFAULTS.tillage.galPerAcre).toBe(0.6);
    // University of Nebraska–Lincoln CropWatch "Fuel Requirements": spray 0.11 gal/ac.
    expect(FUEL_DEFAULTS.spraying.galPerAcre).toBe(0.11);
  });
});
