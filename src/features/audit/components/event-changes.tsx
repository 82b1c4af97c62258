import type { AuditEventDto } from '@shared/types/audit';
import { formatDateTime } from '@/lib/dates';

const ISO_DATE_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/;
const MAX_VALUE_CHARS = 120;

const UNIT_SUFFIXES: [RegExp, string][] = [
  [/LhPer10in$/, 'L/h per 10 in'],
  [/M2Per10in$/, 'm² per 10 in'],
  [/MlMinPer10in$/, 'mL/min per 10 in'],
  [/Per10in$/, 'per 10 in'],
  [/GPerL$/, 'g/L'],
  [/MgL$/, 'mg/L'],
  [/PctVol$/, '% vol'],
  [/Pct$/, '%'],
  [/Lh$/, 'L/h'],
  [/Bar$/, 'bar'],
  [/Mbar$/, 'mbar'],
  [/Um$/, 'µm'],
  [/Mm$/, 'mm'],
  [/Ml$/, 'mL'],
  [/Ntu$/, 'NTU'],
  [/In$/, 'in'],
  [/C$/, '°C'],
  [/L$/, 'L'],
  [/M2$/, 'm²'],
  [/M$/, 'm'],
  [/S$/, 's'],
];

/** A field name as words with its unit: "capacityL" → "Capacity (L)", "housingId" → "Housing id". */
export function fieldLabel(field: string) {
  let unit = '';
  let name = field;
  for (const [re, label] of UNIT_SUFFIXES) {
    if (re.test(field) && field.replace(re, '').length > 0) {
      unit = label;
      name = field.replace(re, '');
      break;
    }
  }
  const words = name
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/_/g, ' ')
    .toLowerCase()
    .replace(/^./, (c) => c.toUpperCase());
  return unit ? `${words} (${unit})` : words;
}

/** A stored value as short text; long structures are cut with an ellipsis (the CSV has them whole). */
export function valueText(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'string') {
    if (ISO_DATE_TIME.test(value)) {
      const d = new Date(value);
      if (!Number.isNaN(d.getTime())) return formatDateTime(d);
    }
    return value.length > MAX_VALUE_CHARS ? `${value.slice(0, MAX_VALUE_CHARS)}…` : value;
  }
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '—';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  const text = structureText(value);
  return text.length > MAX_VALUE_CHARS ? `${text.slice(0, MAX_VALUE_CHARS)}…` : text;
}

/** A nested value (a train's stages, a hose list) as labelled words instead of raw JSON. */
function structureText(value: unknown): string {
  if (Array.isArray(value)) {
    if (value.length === 0) return 'none';
    return value.map((item, i) => (isPlainObject(item) ? `${i + 1}) ${structureText(item)}` : valueText(item))).join('; ');
  }
  if (isPlainObject(value)) {
    const parts = Object.entries(value)
      .filter(([, v]) => v !== null && v !== undefined && v !== '')
      .map(([k, v]) => `${fieldLabel(k)} ${Array.isArray(v) || isPlainObject(v) ? `(${structureText(v)})` : valueText(v)}`);
    return parts.length ? parts.join(', ') : '—';
  }
  return valueText(value);
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** The changed fields of an event, each as before → after. */
export function EventChanges({ event, max = 8 }: { event: AuditEventDto; max?: number }) {
  const entries = Object.entries(event.changes ?? {});
  if (entries.length === 0) return <span className="text-ink-500">No field changed</span>;
  // A new record lists its values; before is empty for each.
  const created = entries.every(([, c]) => c.before === null);
  const removed = entries.every(([, c]) => c.after === null);
  const shown = entries.slice(0, max);
  return (
    <ul className="flex flex-col gap-0.5 text-sm">
      {shown.map(([field, c]) => (
        <li key={field} className="[overflow-wrap:anywhere]">
          <span className="font-semibold text-ink-800">{fieldLabel(field)}:</span>{' '}
          {created ? (
            <span>{valueText(c.after)}</span>
          ) : removed ? (
            <span className="text-ink-600 line-through">{valueText(c.before)}</span>
          ) : (
            <>
              <span className="text-ink-600 line-through">{valueText(c.before)}</span> <span aria-label="became">→</span> <span>{valueText(c.after)}</span>
            </>
          )}
        </li>
      ))}
      {entries.length > max ? <li className="text-ink-500">and {entries.length - max} more (in the CSV)</li> : null}
    </ul>
  );
}
