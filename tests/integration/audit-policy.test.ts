// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { judgeAudit } from '../../scripts/lib/audit';

describe('npm audit policy in npm test', () => {
  it('skips with a note when the registry does not answer the audit', () => {
    const verdict = judgeAudit(JSON.stringify({ message: '405 Method Not Allowed - POST https://registry.npmjs.org/-/npm/v1/security/advisories/bulk', statusCode: 405 }));
    expect(verdict.skipped).toMatch(/did not answer/);
    expect(judgeAudit('').skipped).toBeTruthy();
  });

  it('fails only on high or critical advisories that have a fix; prints the rest', () => {
    const verdict = judgeAudit({
      vulnerabilities: {
        a: { name: 'a', severity: 'critical', fixAvailable: true },
        b: { name: 'b', severity: 'high', fixAvailable: { name: 'b', version: '2.0.0', isSemVerMajor: true } },
        c: { name: 'c', severity: 'high', fixAvailable: false },
        d: { name: 'd', severity: 'moderate', fixAvailable: true },
      },
    });
    expect(verdict.skipped).toBeNull();
    expect(verdict.failing.map((e) => e.name)).toEqual(['a', 'b']);
    expect(verdict.printed.map((e) => e.name)).toEqual(['c', 'd']);
  });
});
