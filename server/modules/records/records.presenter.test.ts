// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { presentIntegrityTest, presentReading } from './records.presenter';
import type { ReadingCorrectionRow, RecordReadingRow } from './records.repository';
import { bottlesOf } from './records.service';

const reading: RecordReadingRow = {
  byName: 'Ana',
  reading: {
    id: 'r1',
    wineryId: 'w',
    runId: 'run',
    stageIndex: 1,
    at: new Date('2026-01-02T10:00:00Z'),
    volumeL: 1000,
    upstreamBar: 2.4,
    downstreamBar: 2.0,
    flowLh: 2400,
    tempC: 12,
    clientKey: 'k',
    createdByName: null,
    createdBy: 'u',
    createdAt: new Date('2026-01-02T10:00:00Z'),
    updatedAt: new Date('2026-01-02T10:00:00Z'),
  },
};
const correction = (over: Partial<ReadingCorrectionRow>): ReadingCorrectionRow => ({
  readingId: 'r1',
  kind: 'correct',
  volumeL: null,
  upstreamBar: null,
  downstreamBar: null,
  flowLh: null,
  tempC: null,
  reason: 'typo',
  byName: 'Ben',
  at: new Date('2026-01-02T11:00:00Z'),
  ...over,
});

describe('record presenter (common practice, no source)', () => {
  it('keeps the original values and lets the latest correction decide what fits use', () => {
    const plain = presentReading(reading, []);
    expect(plain.effective?.volumeL).toBe(1000);
    expect(plain.effective?.dpBar).toBeCloseTo(0.4, 12);
    const corrected = presentReading(reading, [
      correction({ volumeL: 1100, at: new Date('2026-01-02T12:00:00Z') }),
      correction({ kind: 'void', reason: 'gauge stuck', at: new Date('2026-01-02T11:00:00Z') }),
    ]);
    // Original values untouched; both corrections listed oldest first; the later one (a correction) wins.
    expect(corrected).toMatchObject({ volumeL: 1000, upstreamBar: 2.4, voided: false });
    expect(corrected.corrections.map((c) => c.kind)).toEqual(['void', 'correct']);
    expect(corrected.effective).toEqual({ volumeL: 1100, dpBar: 2.4 - 2.0 });
    const voided = presentReading(reading, [correction({ upstreamBar: 2.5 }), correction({ kind: 'void', at: new Date('2026-01-03T00:00:00Z') })]);
    expect(voided.voided).toBe(true);
    expect(voided.effective).toBeNull();
  });

  it('reads each integrity test’s measured value and limit in its own unit', () => {
    const base = { id: 'e', cartridgeId: 'c', kind: 'integrity' as const, at: new Date('2026-01-01T00:00:00Z'), byName: null };
    expect(presentIntegrityTest('S1', { ...base, details: { test: 'diffusion', pass: false, measuredMlMin: 40, maxMlMin: 30 } })).toMatchObject({ measured: 40, limit: 30, limitKind: 'max', unit: 'mL/min', pass: false });
    expect(presentIntegrityTest('S1', { ...base, details: { test: 'pressure-hold', pass: true, measuredDecayMbar: 12, maxDecayMbar: 20 } })).toMatchObject({ unit: 'mbar', limitKind: 'max', pass: true });
  });

  it('counts whole bottles: 4,000 L at 750 mL is 5,333 (4,000,000 / 750 = 5,333.3); none without a bottle size', () => {
    expect(bottlesOf(4000, 750)).toBe(5333);
    expect(bottlesOf(750, 750)).toBe(1000);
    expect(bottlesOf(4000, null)).toBeNull();
    expect(bottlesOf(4000, 0)).toBeNull();
  });
});
