import { describe, expect, it } from 'vitest';
import { PREFERRED_LENGTHS_MM, longestPreferredLength, nut, pitchMm, screwHead, shortestPreferredLength } from '../../src/assembly/index.js';

describe('fastener tables against the standards (reference-values.md, "Assembly hardware")', () => {
  it('ISO 4762 socket head cap screws: head diameter dk max and height k max', () => {
    // ISO 4762: M2 3.8 / 2.0, M2.5 4.5 / 2.5, M3 5.5 / 3.0, M4 7.0 / 4.0.
    const rows: Array<[Parameters<typeof screwHead>[0], number, number]> = [['M2', 3.8, 2.0], ['M2.5', 4.5, 2.5], ['M3', 5.5, 3.0], ['M4', 7.0, 4.0]];
    for (const [size, dk, k] of rows) {
      const h = screwHead(size, 'socket');
      expect(h.standard).toBe('ISO 4762');
      expect(h.diameterMm).toBe(dk);
      expect(h.heightMm).toBe(k);
    }
  });

  it('ISO 7380-1 button heads from M3; smaller sizes fall back to ISO 4762', () => {
    // ISO 7380-1: M3 dk 5.7, k 1.65; M4 7.6 / 2.2.
    expect(screwHead('M3', 'button')).toMatchObject({ standard: 'ISO 7380-1', diameterMm: 5.7, heightMm: 1.65 });
    expect(screwHead('M4', 'button')).toMatchObject({ standard: 'ISO 7380-1', diameterMm: 7.6, heightMm: 2.2 });
    expect(screwHead('M2', 'button').standard).toBe('ISO 4762');
  });

  it('90° countersunk heads: ISO 10642 from M3, ISO 14581 below, and k = (dk − d) / 2 for a 90° cone', () => {
    // ISO 10642: M3 dk 6.72, k 1.86; M4 8.96 / 2.48. ISO 14581: M2 4.4 / 1.2, M2.5 5.5 / 1.5.
    expect(screwHead('M3', 'countersunk')).toMatchObject({ standard: 'ISO 10642', diameterMm: 6.72, heightMm: 1.86 });
    expect(screwHead('M4', 'countersunk')).toMatchObject({ standard: 'ISO 10642', diameterMm: 8.96, heightMm: 2.48 });
    expect(screwHead('M2', 'countersunk')).toMatchObject({ standard: 'ISO 14581', diameterMm: 4.4, heightMm: 1.2 });
    expect(screwHead('M2.5', 'countersunk')).toMatchObject({ standard: 'ISO 14581', diameterMm: 5.5, heightMm: 1.5 });
    for (const size of ['M2', 'M2.5', 'M3', 'M4'] as const) {
      const h = screwHead(size, 'countersunk');
      // Identity for a 90° cone (reference-values.md: exact for these rows).
      expect(h.heightMm).toBeCloseTo((h.diameterMm - Number(size.slice(1))) / 2, 9);
    }
  });

  it('nuts: ISO 4032 heights, ISO 4035 thin M3, ISO 7040 prevailing torque from M3', () => {
    // ISO 4032 m: M2 1.6, M2.5 2.0, M3 2.4, M4 3.2. ISO 4035: M3 1.8. ISO 7040: M3 4.0, M4 5.0.
    expect([nut('M2', 'hex').heightMm, nut('M2.5', 'hex').heightMm, nut('M3', 'hex').heightMm, nut('M4', 'hex').heightMm]).toEqual([1.6, 2.0, 2.4, 3.2]);
    expect(nut('M3', 'hex').standard).toBe('ISO 4032');
    expect(nut('M3', 'thin')).toMatchObject({ standard: 'ISO 4035', heightMm: 1.8 });
    expect(nut('M3', 'locking')).toMatchObject({ standard: 'ISO 7040', heightMm: 4.0 });
    expect(nut('M4', 'locking')).toMatchObject({ standard: 'ISO 7040', heightMm: 5.0 });
    // ISO 7040 starts at M3: an M2 locking nut is a regular nut.
    expect(nut('M2', 'locking').standard).toBe('ISO 4032');
  });

  it('ISO 261 coarse pitch (M3 0.5 mm, the full-engagement allowance of domain.md)', () => {
    expect(pitchMm('M3')).toBe(0.5);
    expect(pitchMm('M2')).toBe(0.4);
  });

  it('ISO 4762 preferred lengths: 3 … 50 as listed, without the commercial 14, 18, 22', () => {
    // reference-values.md: 3, 4, 5, 6, 8, 10, 12, 16, 20, 25, 30, 35, 40, 45, 50.
    expect(PREFERRED_LENGTHS_MM.slice(0, 15)).toEqual([3, 4, 5, 6, 8, 10, 12, 16, 20, 25, 30, 35, 40, 45, 50]);
    for (const l of [14, 18, 22]) expect(PREFERRED_LENGTHS_MM).not.toContain(l);
    expect(shortestPreferredLength(8)).toBe(8);
    expect(shortestPreferredLength(8.0000000001)).toBe(8);
    expect(shortestPreferredLength(8.01)).toBe(10);
    expect(shortestPreferredLength(13)).toBe(16);
    expect(shortestPreferredLength(61)).toBeNull();
    expect(longestPreferredLength(9.5)).toBe(8);
    expect(longestPreferredLength(2)).toBeNull();
  });
});
