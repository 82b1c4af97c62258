import { BookmarkPlus, Plus, X } from 'lucide-react';
import { useState } from 'react';
import { convert } from '@shared/engine';
import { HOSES_MAX, type TrainHoseInput } from '@shared/schemas/plans';
import { Button } from '@/components/ui/button';
import { NumberInput } from '@/components/ui/input';
import { parseNumberText } from '@/lib/number-input';
import type { useUnits } from '@/lib/units';
import type { HosePresetDto } from '@shared/types/hose-presets';
import { HosePresetPicker, SaveHosePresetDialog, useCanSavePresets } from './hose-presets';

type Units = ReturnType<typeof useUnits>;

/** A hose as typed: text until sized or saved. */
export type DraftHose = { diameter: string; length: string; sumK: string; /** Carried from a picked preset (not typed here). */ roughnessMm?: number | null };

const diameterUnit = (u: Units) => (u.system === 'us' ? 'in' : 'mm');
const diameterText = (mm: number, u: Units) => (u.system === 'us' ? String(Number(convert(mm, 'mm', 'inch').toFixed(4))) : String(mm));
const diameterMm = (typed: number, u: Units) => (u.system === 'us' && Number.isFinite(typed) ? convert(typed, 'inch', 'mm') : typed);

/** Converts a finite number; NaN stays NaN (the engine or the server then says what is wrong). */
const finiteOr = (v: number, f: (v: number) => number) => (Number.isFinite(v) ? f(v) : v);

/** The saved hoses as the person's units show them. */
export const toDraftHoses = (hoses: TrainHoseInput[] | null, u: Units): DraftHose[] =>
  (hoses ?? []).map((h) => ({
    diameter: diameterText(h.diameterMm, u),
    length: u.toInput('length', h.lengthM),
    sumK: h.sumK === null || h.sumK === undefined ? '' : String(h.sumK),
  }));

/**
 * Hoses to size or save, in mm and m; a figure left as shown keeps its stored value exactly.
 * A number that cannot be read becomes NaN so the engine or the server says why.
 */
export const toHoses = (draft: DraftHose[], saved: TrainHoseInput[] | null, u: Units): TrainHoseInput[] =>
  draft.flatMap((d, i) => {
    // A row just added and still empty is not a hose yet.
    if (d.diameter.trim() === '' && d.length.trim() === '' && d.sumK.trim() === '') return [];
    const before = saved?.[i];
    const same = (text: string, shown: string | undefined) => before !== undefined && text === shown;
    const num = (text: string) => parseNumberText(text) ?? Number.NaN;
    const shown = before ? toDraftHoses([before], u)[0] : undefined;
    return [{
      diameterMm: same(d.diameter, shown?.diameter) ? before!.diameterMm : diameterMm(num(d.diameter), u),
      lengthM: same(d.length, shown?.length) ? before!.lengthM : finiteOr(num(d.length), (v) => u.fromInput('length', v)),
      roughnessMm: d.roughnessMm !== undefined ? d.roughnessMm : (before?.roughnessMm ?? null),
      sumK: d.sumK.trim() === '' ? null : same(d.sumK, shown?.sumK) ? (before!.sumK ?? null) : num(d.sumK),
    }];
  });

/** The train's hoses and lines (diameter, length, fittings as ΣK), edited in place. */
export function HosesEditor({ id, draft, setDraft, editable, units: u }: { id: string; draft: DraftHose[]; setDraft: (next: DraftHose[]) => void; editable: boolean; units: Units }) {
  const set = (i: number, patch: Partial<DraftHose>) => setDraft(draft.map((h, k) => (k === i ? { ...h, ...patch } : h)));
  const canSave = useCanSavePresets();
  const [saving, setSaving] = useState<TrainHoseInput | null>(null);
  const [saveNote, setSaveNote] = useState<string | null>(null);
  /** A preset becomes a new row, shown in the person's units. */
  const pick = (p: HosePresetDto) => setDraft([...draft, { ...toDraftHoses([p], u)[0], roughnessMm: p.roughnessMm }]);
  const saveAsPreset = (i: number) => {
    const hose = toHoses([draft[i]], null, u)[0] as TrainHoseInput | undefined;
    if (!hose || ![hose.diameterMm, hose.lengthM].every((v) => Number.isFinite(v) && v > 0)) {
      setSaveNote(`Enter hose ${i + 1}’s diameter and length before saving it as a preset.`);
      return;
    }
    setSaveNote(null);
    setSaving(hose);
  };
  return (
    <fieldset className="rounded border border-ink-200 px-2.5 py-2">
      <legend className="px-1 text-sm font-semibold text-ink-800">Hoses and lines</legend>
      {draft.length === 0 ? <p className="text-sm text-ink-600">None entered: the pump pressure counts no line loss.</p> : null}
      <ol className="flex flex-col gap-2" aria-label="Hoses">
        {draft.map((h, i) => (
          <li key={i} aria-label={`Hose ${i + 1}`} className="grid grid-cols-[1fr_1fr_0.8fr_auto] items-end gap-1.5">
            <label className="text-xs text-ink-700" htmlFor={`${id}-hd${i}`}>
              Diameter
              <NumberInput id={`${id}-hd${i}`} unit={diameterUnit(u)} disabled={!editable} value={h.diameter} onChange={(e) => set(i, { diameter: e.target.value })} />
            </label>
            <label className="text-xs text-ink-700" htmlFor={`${id}-hl${i}`}>
              Length
              <NumberInput id={`${id}-hl${i}`} unit={u.symbol('length')} disabled={!editable} value={h.length} onChange={(e) => set(i, { length: e.target.value })} />
            </label>
            <label className="text-xs text-ink-700" htmlFor={`${id}-hk${i}`}>
              Fittings ΣK
              <NumberInput id={`${id}-hk${i}`} placeholder="0" disabled={!editable} value={h.sumK} onChange={(e) => set(i, { sumK: e.target.value })} />
            </label>
            {editable ? (
              <span className="flex">
                {canSave ? <Button variant="ghost" size="sm" icon={<BookmarkPlus />} aria-label={`Save hose ${i + 1} as a preset`} title="Save as preset" onClick={() => saveAsPreset(i)} /> : null}
                <Button variant="ghost" size="sm" icon={<X />} aria-label={`Remove hose ${i + 1}`} onClick={() => setDraft(draft.filter((_, k) => k !== i))} />
              </span>
            ) : null}
          </li>
        ))}
      </ol>
      {saveNote ? <p role="status" className="mt-1 text-sm text-watch-800">{saveNote}</p> : null}
      {editable && draft.length < HOSES_MAX ? (
        <div className="mt-1 flex flex-wrap items-end gap-2">
          <Button variant="ghost" size="sm" icon={<Plus />} onClick={() => setDraft([...draft, { diameter: '', length: '', sumK: '' }])}>
            Add hose
          </Button>
          <HosePresetPicker id={`${id}-preset`} onPick={pick} units={u} />
        </div>
      ) : null}
      <SaveHosePresetDialog hose={saving} onClose={() => setSaving(null)} units={u} />
    </fieldset>
  );
}
