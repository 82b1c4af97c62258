// `npm audit --omit=dev` as part of `npm test`: the production dependencies' known advisories.
// Policy: a high or critical advisory that has a fix available fails the suite (update the
// package); every other advisory — lower severity, or no fix published yet — is printed, not
// fatal, so the suite does not fail on something nobody can act on. When the registry does not
// answer the audit (offline, a mirror without the audit endpoint), it is skipped with a note.
import { spawnSync } from 'node:child_process';

export type AuditEntry = { name: string; severity: string; fixAvailable: unknown; via?: unknown[] };
export type AuditVerdict = { skipped: string | null; failing: AuditEntry[]; printed: AuditEntry[] };

const FATAL = new Set(['high', 'critical']);

/** Applies the policy to `npm audit --json` output (already parsed, or the raw text). */
export function judgeAudit(output: unknown): AuditVerdict {
  let report: unknown = output;
  if (typeof output === 'string') {
    try {
      report = JSON.parse(output);
    } catch {
      return { skipped: 'npm audit gave no readable answer', failing: [], printed: [] };
    }
  }
  const vulns = (report as { vulnerabilities?: Record<string, AuditEntry> } | null)?.vulnerabilities;
  if (!vulns || typeof vulns !== 'object') {
    const message = (report as { message?: string; error?: { summary?: string } } | null)?.message ?? 'no audit report';
    return { skipped: `the registry did not answer the audit (${message})`, failing: [], printed: [] };
  }
  const failing: AuditEntry[] = [];
  const printed: AuditEntry[] = [];
  for (const [name, entry] of Object.entries(vulns)) {
    const item = { ...entry, name: entry.name ?? name };
    if (FATAL.has(item.severity) && item.fixAvailable !== false && item.fixAvailable != null) failing.push(item);
    else printed.push(item);
  }
  return { skipped: null, failing, printed };
}

/** Runs the audit and prints the verdict; returns false when the suite should fail. */
export function runAudit(cwd: string): boolean {
  console.log('[porewise] npm audit --omit=dev …');
  const res = spawnSync('npm', ['audit', '--omit=dev', '--json'], { cwd, encoding: 'utf8', timeout: 90_000 });
  if (res.error) {
    console.log(`[porewise] npm audit skipped: ${res.error.message}`);
    return true;
  }
  const verdict = judgeAudit(res.stdout);
  if (verdict.skipped) {
    console.log(`[porewise] npm audit skipped: ${verdict.skipped}`);
    return true;
  }
  const line = (e: AuditEntry) => `    ${e.name} (${e.severity})${e.fixAvailable === false ? ', no fix published yet' : ', fix available'}`;
  if (verdict.printed.length) {
    console.log('[porewise] advisories that do not fail the suite (lower severity, or no fix yet):');
    for (const e of verdict.printed) console.log(line(e));
  }
  if (verdict.failing.length) {
    console.log('[porewise] high or critical advisories with a fix available — update these packages:');
    for (const e of verdict.failing) console.log(line(e));
    return false;
  }
  if (!verdict.printed.length) console.log('[porewise] npm audit: no known advisories in production dependencies');
  return true;
}
