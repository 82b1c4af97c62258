import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable, isUniqueViolation } from './errors';

// The shapes node-postgres gives (code, constraint) and Drizzle's wrapping (cause); no database needed.
const pgUnique = (constraint: string) => Object.assign(new Error(`duplicate key value violates unique constraint "${constraint}"`), { code: '23505', constraint });
const wrapped = (cause: unknown) => Object.assign(new Error('Failed query'), { cause });

describe('isUniqueViolation', () => {
  it('with a constraint: only that one, found through wrapped causes', () => {
    expect(isUniqueViolation(pgUnique('tanks_winery_name_uq'), 'tanks_winery_name_uq')).toBe(true);
    expect(isUniqueViolation(wrapped(wrapped(pgUnique('cartridges_winery_serial_uq'))), 'cartridges_winery_serial_uq')).toBe(true);
    expect(isUniqueViolation(wrapped(pgUnique('lots_winery_code_uq')), 'tanks_winery_name_uq')).toBe(false);
  });

  it('names the constraint from the message when the driver leaves the field out', () => {
    const e = Object.assign(new Error('duplicate key value violates unique constraint "plan_lots_plan_lot_uq"'), { code: '23505' });
    expect(isUniqueViolation(e, 'plan_lots_plan_lot_uq')).toBe(true);
  });

  it('without a constraint: any unique violation, nothing else', () => {
    expect(isUniqueViolation(wrapped(pgUnique('housings_winery_name_uq')))).toBe(true);
    expect(isUniqueViolation(Object.assign(new Error('fk'), { code: '23503' }))).toBe(false);
    expect(isUniqueViolation(null)).toBe(false);
    expect(isUniqueViolation('23505')).toBe(false);
  });
});

describe('isDatabaseUnavailable', () => {
  it('knows a refused connection and a shutdown, not a constraint', () => {
    expect(isDatabaseUnavailable(wrapped(Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' })))).toBe(true);
    expect(isDatabaseUnavailable(Object.assign(new Error('terminating connection'), { code: '57P01' }))).toBe(true);
    expect(isDatabaseUnavailable(pgUnique('x'))).toBe(false);
  });
});
