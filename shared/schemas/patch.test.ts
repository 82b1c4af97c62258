import { describe, expect, it } from 'vitest';
import { labResultInputSchema, labResultPatchSchema, lotPatchSchema, tankPatchSchema } from './cellar';
import { sentFields } from './patch';

describe('patchSchemaOf (PATCH bodies)', () => {
  it('leaves out what was not sent: no defaults are filled in', () => {
    expect(lotPatchSchema.parse({ tempC: 14 })).toEqual({ tempC: 14 });
    expect(tankPatchSchema.parse({})).toEqual({});
  });

  it('checks each field sent by its own rule, with the field named', () => {
    const bad = tankPatchSchema.safeParse({ capacityL: -1 });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0].path).toEqual(['capacityL']);
    expect(lotPatchSchema.safeParse({ tankId: null }).success).toBe(true);
    expect(lotPatchSchema.safeParse({ name: null }).success).toBe(false);
  });

  it('leaves the rules across fields to the merged record', () => {
    // One clogging time alone is fine in a patch; the full schema refuses it on a whole result.
    expect(labResultPatchSchema.safeParse({ t400s: 20 }).success).toBe(true);
    expect(labResultInputSchema.safeParse({ sampledAt: '2025-03-10T09:30:00Z', t400s: 20 }).success).toBe(false);
  });

  it('sentFields drops the keys that were not sent', () => {
    expect(sentFields({ a: 1, b: undefined, c: null })).toEqual({ a: 1, c: null });
  });
});
