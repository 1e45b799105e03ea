import { describe, expect, it } from 'vitest';
import { checkComfort, moistureStatus, tempStatus } from '@/lib/evidence';

describe('worm comfort', () => {
  it('Eisenia fetida temperatures', () => {
    // REFERENCES §3: Loehr, Neuhauser & Malecki 1985 — best growth 20–25 °C (V abstract)
    expect(tempStatus(25).status).toBe('within limits');
    // REFERENCES §3: Loehr et al. 1985 — worms die at 35 °C (V abstract)
    expect(tempStatus(35).status).toBe('lethal');
    // REFERENCES §3: Edwards (ed.) 2004, Table 18.3 — limits 4–30 °C (V2)
    const cold = tempStatus(2);
    expect(cold.status).toBe('stressful');
    expect(cold.reason).toBe('below the 4 °C limit');
    expect(tempStatus(4).status).toBe('within limits');
    expect(tempStatus(30).status).toBe('within limits');
    expect(tempStatus(30.5)).toEqual({ status: 'stressful', reason: 'above the 30 °C limit' });
    expect(tempStatus(34.9).status).toBe('stressful');
    // common practice (no published source): a frozen bed kills worms
    expect(tempStatus(0).status).toBe('lethal');
    expect(tempStatus(0.5).status).toBe('stressful');
  });

  it('E. andrei is treated like E. fetida', () => {
    // from memory: E. andrei has the same limits as its sibling species (Table 18.3 is for E. fetida)
    expect(tempStatus(2, 'eisenia-andrei')).toEqual(tempStatus(2, 'eisenia-fetida'));
    expect(tempStatus(35, 'eisenia-andrei').status).toBe('lethal');
  });

  it('cold-limited tropical species', () => {
    // TRADE §4: P. excavatus and E. eugeniae die below about 9 °C and above about 30 °C (RVS92; 9/30 °C from memory)
    for (const sp of ['perionyx-excavatus', 'eudrilus-eugeniae'] as const) {
      expect(tempStatus(8, sp).status).toBe('lethal');
      expect(tempStatus(9, sp).status).toBe('within limits');
      expect(tempStatus(25, sp).status).toBe('within limits');
      expect(tempStatus(30, sp).status).toBe('within limits');
      expect(tempStatus(31, sp).status).toBe('lethal');
    }
  });

  it('moisture limits 60–90 %', () => {
    // REFERENCES §3: Table 18.3 — moisture limits 60–90 % (V2)
    expect(moistureStatus(85).status).toBe('within limits');
    expect(moistureStatus(60).status).toBe('within limits');
    expect(moistureStatus(55)).toEqual({ status: 'stressful', reason: 'below the 60% moisture limit' });
    expect(moistureStatus(95).status).toBe('stressful');
    // REFERENCES §3: Table 18.3 — aerobic conditions; a waterlogged bed goes anaerobic
    expect(moistureStatus('waterlogged').status).toBe('stressful');
    expect(moistureStatus('damp').status).toBe('within limits');
    expect(moistureStatus('dry').status).toBe('stressful');
    expect(() => moistureStatus(120)).toThrow(RangeError);
  });

  it('combined check reports the worst reading and its reason', () => {
    // REFERENCES §3 (Loehr 1985; Table 18.3) via tempStatus / moistureStatus; project rule: worst status wins
    const r = checkComfort({ bedTempC: 36, moisture: 'dry' });
    expect(r.status).toBe('lethal');
    expect(r.reasons).toEqual(['at or above 35 °C, where worms die', 'dry bedding, below the 60% limit']);
    expect(checkComfort({ bedTempC: 20, moisture: 80 }).status).toBe('within limits');
    expect(() => checkComfort({})).toThrow(RangeError);
    expect(() => tempStatus(Number.NaN)).toThrow(RangeError);
    expect(() => tempStatus(20, 'lumbricus-terrestris' as never)).toThrow(RangeError);
  });
});
