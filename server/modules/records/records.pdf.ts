import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import PDFDocument from 'pdfkit';
import { formatNumber } from '../../../shared/engine';
import { integrityTestLabels, cycleKindLabels } from '../../../shared/schemas/care';
import type { RecordPaper } from '../../../shared/schemas/records';
import type { FilterRecordDto, RecordIntegrityTestDto, RecordReadinessDto, RecordRunDto, RecordStageDto } from '../../../shared/types/records';

const require = createRequire(import.meta.url);
const fontDir = join(dirname(require.resolve('@fontsource/source-sans-3/package.json')), 'files');
/** The app's own typeface (Source Sans 3, SIL Open Font License), embedded from its WOFF files. */
const FONTS = {
  regular: join(fontDir, 'source-sans-3-latin-400-normal.woff'),
  bold: join(fontDir, 'source-sans-3-latin-600-normal.woff'),
  greek: join(fontDir, 'source-sans-3-greek-400-normal.woff'),
  greekBold: join(fontDir, 'source-sans-3-greek-600-normal.woff'),
};

const INK = '#1f2a24';
const MUTED = '#5b6760';
const RULE = '#c9d1cc';
const GOOD = '#1d6b3a';
const BAD = '#a32b1f';
const ACCENT = '#2f6f5e';

const MARGIN = 48;
const FOOTER = 46;

const fmt = (v: number | null | undefined, digits = 0, unit = '') => (v === null || v === undefined || !Number.isFinite(v) ? '—' : `${formatNumber(v, digits)}${unit ? ` ${unit}` : ''}`);
/** Date and time in a table cell; the column says UTC. */
const stamp = (iso: string | null) => (iso ? `${iso.slice(0, 10)} ${iso.slice(11, 16)}` : '—');
const when = (iso: string | null) => (iso ? `${stamp(iso)} UTC` : '—');
/** Who did it and when, as the record states it ("unknown" when the person is not on record). */
const whenBy = (iso: string | null, name: string | null) => `${when(iso)} by ${name ?? 'unknown'}`;
const lawNames: Record<string, string> = { complete: 'complete blocking', standard: 'standard blocking', intermediate: 'intermediate blocking', cake: 'cake filtration' };

/** The readiness thresholds a verdict was judged against, in one line, and where they come from. */
function readinessThresholdsLine(r: RecordReadinessDto): string {
  const t = r.thresholds;
  const whose = t.isDefault ? 'Porewise defaults' : 'the winery’s own thresholds';
  const when = r.source === 'frozen-at-start' ? 'as in force when the run started' : 'as they are now';
  return (
    `${whose}, ${when}: turbidity ready up to ${fmt(t.turbidity.limitNtu, 1, 'NTU')}, borderline up to ${fmt(t.turbidity.limitNtu + t.turbidity.borderlineMarginNtu, 1, 'NTU')}; ` +
    `clogging index ready up to ${fmt(t.cloggingIndex.readyMaxS, 0, 's')}, borderline up to ${fmt(t.cloggingIndex.borderlineMaxS, 0, 's')} (valid below ${fmt(t.cloggingIndexValidity.validBelowNtu, 0, 'NTU')}); ` +
    `Vmax safety factor ready from ${fmt(t.vmax.readyMinSafetyFactor, 1)}, borderline from ${fmt(t.vmax.borderlineMinSafetyFactor, 1)}.`
  );
}

type Column = { label: string; width: number; align?: 'left' | 'right' };
type Doc = PDFKit.PDFDocument;

/** Draws the record as a PDF (vector charts, embedded font, fingerprint on every page); resolves to the bytes. */
export function renderRecordPdf(record: FilterRecordDto, paper: RecordPaper): Promise<Buffer> {
  const doc: Doc = new PDFDocument({
    size: paper === 'letter' ? 'LETTER' : 'A4',
    margins: { top: MARGIN, left: MARGIN, right: MARGIN, bottom: MARGIN + FOOTER },
    bufferPages: true,
    info: { Title: `Filtration record ${record.lot.code}`, Author: 'Porewise', Subject: `Fingerprint ${record.fingerprint}`, Creator: 'Porewise' },
  });
  doc.registerFont('body', FONTS.regular);
  doc.registerFont('bold', FONTS.bold);
  doc.registerFont('greek', FONTS.greek);
  doc.registerFont('greekBold', FONTS.greekBold);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const left = MARGIN;
  const width = () => doc.page.width - 2 * MARGIN;
  const bottom = () => doc.page.height - MARGIN - FOOTER;
  const ensure = (h: number) => {
    if (doc.y + h > bottom()) doc.addPage();
  };

  /** Text that may hold Greek letters (ΔP): the Latin subset lacks them, so those runs use the Greek subset. */
  const text = (s: string, o: { bold?: boolean; size?: number; color?: string; x?: number; width?: number; gap?: number } = {}) => {
    doc.fontSize(o.size ?? 9.5).fillColor(o.color ?? INK);
    const parts = s.split(/([\u0370-\u03ff]+)/).filter((p) => p !== '');
    const x = o.x ?? left;
    const w = o.width ?? width() - (x - left);
    parts.forEach((p, i) => {
      const greek = /^[\u0370-\u03ff]+$/.test(p);
      doc.font(greek ? (o.bold ? 'greekBold' : 'greek') : o.bold ? 'bold' : 'body');
      const last = i === parts.length - 1;
      if (i === 0) doc.text(p, x, doc.y, { width: w, continued: !last });
      else doc.text(p, { continued: !last });
    });
    if (parts.length === 0) doc.text('', x, doc.y, { width: w });
    if (o.gap) doc.moveDown(o.gap);
  };
  /** One line of small bold header text at a fixed place, Greek runs in the Greek subset. */
  const inline = (s: string, x: number, y: number, w: number, align: 'left' | 'right') => {
    const parts = s.split(/([\u0370-\u03ff]+)/).filter((p) => p !== '');
    const fontOf = (p: string) => (/^[\u0370-\u03ff]+$/.test(p) ? 'greekBold' : 'bold');
    doc.fontSize(8).fillColor(MUTED);
    const total = parts.reduce((sum, p) => sum + doc.font(fontOf(p)).widthOfString(p), 0);
    let cx = align === 'right' ? x + Math.max(0, w - total) : x;
    for (const p of parts) {
      doc.font(fontOf(p));
      const pw = doc.widthOfString(p);
      doc.text(p, cx, y, { lineBreak: false, width: pw + 1 });
      cx += pw;
    }
  };
  const heading = (s: string, size = 13) => {
    ensure(size * 3);
    doc.moveDown(0.6);
    text(s, { bold: true, size, color: ACCENT });
    doc.moveDown(0.2);
  };
  const field = (label: string, value: string) => {
    ensure(14);
    const y = doc.y;
    doc.font('bold').fontSize(9.5).fillColor(MUTED).text(label, left, y, { width: 150 });
    const yAfterLabel = doc.y;
    doc.y = y;
    text(value, { x: left + 155, width: width() - 155 });
    doc.y = Math.max(doc.y, yAfterLabel);
  };

  /** A table with fixed columns; rows break across pages with the header repeated. */
  const table = (cols: Column[], rows: { cells: string[]; color?: (string | undefined)[] }[]) => {
    const total = cols.reduce((s, c) => s + c.width, 0);
    const scale = width() / total;
    const xs: number[] = [];
    let acc = left;
    for (const c of cols) {
      xs.push(acc);
      acc += c.width * scale;
    }
    const rowH = 13;
    const header = () => {
      const y = doc.y;
      cols.forEach((c, i) => inline(c.label, xs[i] + 2, y + 2, c.width * scale - 4, c.align ?? 'left'));
      doc.moveTo(left, y + rowH).lineTo(left + width(), y + rowH).lineWidth(0.6).strokeColor(RULE).stroke();
      doc.y = y + rowH + 1;
    };
    ensure(rowH * 2);
    header();
    for (const r of rows) {
      doc.font('body').fontSize(8.5);
      const h = Math.max(rowH, ...r.cells.map((cell, i) => doc.heightOfString(cell || ' ', { width: cols[i].width * scale - 4 }) + 3));
      if (doc.y + h > bottom()) {
        doc.addPage();
        header();
      }
      const y = doc.y;
      r.cells.forEach((cell, i) => {
        doc
          .font('body')
          .fontSize(8.5)
          .fillColor(r.color?.[i] ?? INK)
          .text(cell, xs[i] + 2, y + 2, { width: cols[i].width * scale - 4, align: cols[i].align ?? 'left' });
      });
      doc.moveTo(left, y + h).lineTo(left + width(), y + h).lineWidth(0.3).strokeColor(RULE).stroke();
      doc.y = y + h;
    }
    doc.x = left;
    doc.moveDown(0.5);
  };

  /** ΔP against litres: the readings as dots, the fitted law as a line, terminal ΔP dashed. All vectors. */
  const chart = (stage: RecordStageDto) => {
    const points = stage.readings.filter((r) => !r.voided).map((r) => {
      const c = r.corrections.at(-1);
      /** The latest correction's value where it gives one, else the reading as logged. */
      const latest = (key: 'volumeL' | 'upstreamBar' | 'downstreamBar') => (c?.kind === 'correct' ? (c[key] ?? r[key]) : r[key]);
      return { volumeL: latest('volumeL'), dpBar: latest('upstreamBar') - latest('downstreamBar') };
    });
    if (points.length === 0) return;
    const h = 150;
    ensure(h + 40);
    const x0 = left + 40;
    const y0 = doc.y + 6;
    const w = width() - 60;
    const curve = stage.curve.filter((p) => Number.isFinite(p.volumeL) && Number.isFinite(p.dpBar));
    const maxPointV = Math.max(...points.map((p) => p.volumeL), 1);
    const maxV = Math.max(maxPointV, ...curve.map((p) => p.volumeL).filter((v) => v <= maxPointV * 1.6)) * 1.05;
    const maxDp = Math.max(stage.terminalDpBar, ...points.map((p) => p.dpBar), 0.1) * 1.15;
    const X = (v: number) => x0 + (Math.min(v, maxV) / maxV) * w;
    const Y = (dp: number) => y0 + h - (Math.max(0, Math.min(dp, maxDp)) / maxDp) * h;
    doc.save();
    doc.rect(x0, y0, w, h).lineWidth(0.6).strokeColor(RULE).stroke();
    doc.font('body').fontSize(7).fillColor(MUTED);
    for (let i = 0; i <= 4; i++) {
      const dp = (maxDp * i) / 4;
      doc.moveTo(x0, Y(dp)).lineTo(x0 + w, Y(dp)).lineWidth(0.2).strokeColor(RULE).stroke();
      doc.text(formatNumber(dp, 2), x0 - 36, Y(dp) - 3, { width: 32, align: 'right', lineBreak: false });
      const v = (maxV * i) / 4;
      doc.text(formatNumber(v, 0), X(v) - 30, y0 + h + 3, { width: 60, align: 'center', lineBreak: false });
    }
    if (stage.terminalDpBar > 0) {
      doc.moveTo(x0, Y(stage.terminalDpBar)).lineTo(x0 + w, Y(stage.terminalDpBar)).dash(4, { space: 3 }).lineWidth(0.8).strokeColor(BAD).stroke().undash();
    }
    const shown = curve.filter((p) => p.volumeL <= maxV);
    if (shown.length > 1) {
      doc.moveTo(X(shown[0].volumeL), Y(shown[0].dpBar));
      for (const p of shown.slice(1)) doc.lineTo(X(p.volumeL), Y(p.dpBar));
      doc.lineWidth(1.2).strokeColor(ACCENT).stroke();
    }
    for (const p of points) doc.circle(X(p.volumeL), Y(p.dpBar), 2).fillColor(INK).fill();
    doc.restore();
    doc.y = y0 + h + 14;
    text(`ΔP (bar) against litres through the train. Dots: readings${stage.curve.length > 1 ? '; line: fitted law' : ''}${stage.terminalDpBar > 0 ? `; dashed: terminal ΔP ${fmt(stage.terminalDpBar, 2, 'bar')}` : ''}.`, {
      size: 7.5,
      color: MUTED,
      gap: 0.3,
    });
  };

  const integrityRows = (tests: RecordIntegrityTestDto[]) =>
    tests.map((t) => ({
      cells: [t.serial, integrityTestLabels[t.test], fmt(t.measured, 2, t.unit), `${t.limitKind === 'min' ? 'at least' : 'at most'} ${fmt(t.limit, 2, t.unit)}`, t.pass ? 'PASS' : 'FAIL', t.byName ?? '—', stamp(t.at)],
      color: [undefined, undefined, undefined, undefined, t.pass ? GOOD : BAD],
    }));
  /** A titled table of integrity tests, or what stands in for it when there is none. */
  const integrityTests = (title: string, tests: RecordIntegrityTestDto[], none: string) => {
    text(title, { bold: true, gap: 0.1 });
    if (tests.length === 0) text(none, { color: BAD, gap: 0.3 });
    else table(integrityCols, integrityRows(tests));
  };
  const integrityCols: Column[] = [
    { label: 'Serial', width: 105 },
    { label: 'Test', width: 60 },
    { label: 'Measured', width: 70, align: 'right' },
    { label: 'Limit', width: 90, align: 'right' },
    { label: 'Result', width: 40 },
    { label: 'By', width: 80 },
    { label: 'When (UTC)', width: 85 },
  ];

  const stageSection = (run: RecordRunDto, s: RecordStageDto) => {
    heading(`Stage ${String(s.index + 1)}: ${s.name} (${s.kind}) in ${s.housingName}`, 11);
    field('Planned type', `${s.plannedTypeName}; terminal ΔP ${fmt(s.terminalDpBar, 2, 'bar')}`);
    doc.moveDown(0.3);
    if (s.cartridges.length === 0) text('No cartridge is on record for this stage.', { color: BAD, gap: 0.4 });
    else
      table(
        [
          { label: 'Serial', width: 105 },
          { label: 'Batch', width: 75 },
          { label: 'Type', width: 85 },
          { label: 'Rating', width: 45, align: 'right' },
          { label: 'Length', width: 40, align: 'right' },
          { label: 'Litres carried', width: 65, align: 'right' },
          { label: 'Litres before', width: 60, align: 'right' },
          { label: 'Cycles before (S/HW/C)', width: 80, align: 'right' },
        ],
        s.cartridges.map((c) => ({
          cells: [
            c.serial,
            c.batch || '—',
            c.typeName,
            `${fmt(c.ratingUm, 2)} µm`,
            `${String(c.lengthIn)} in`,
            c.litresCarried === null ? 'run open' : fmt(c.litresCarried, 0, 'L'),
            fmt(c.litresAtStart, 0, 'L'),
            `${String(c.cyclesAtStart.steam)} / ${String(c.cyclesAtStart.hotWater)} / ${String(c.cyclesAtStart.chemical)}`,
          ],
        })),
      );
    if (s.changes.length === 0) text('No cartridge changes or regenerations during the run.', { color: MUTED, gap: 0.3 });
    for (const c of s.changes) {
      text(`${c.kind === 'change' ? 'Change' : 'Regeneration'} at ${fmt(c.atVolumeL, 0, 'L')} (${when(c.at)}, ${c.byName ?? 'unknown'}): out ${c.removedSerials.join(', ') || '—'}; in ${c.installedSerials.join(', ') || '—'}.`, { gap: 0.2 });
    }
    text('Sanitation before the run', { bold: true, gap: 0.1 });
    if (s.sanitation.length === 0) text('No sanitation was logged for these cartridges since their previous run.', { color: BAD, gap: 0.3 });
    else
      table(
        [
          { label: 'Serial', width: 105 },
          { label: 'Cycle', width: 65 },
          { label: 'Temperature', width: 60, align: 'right' },
          { label: 'Duration', width: 55, align: 'right' },
          { label: 'Agent', width: 80 },
          { label: 'By', width: 80 },
          { label: 'When (UTC)', width: 90 },
        ],
        s.sanitation.map((x) => ({ cells: [x.serial, cycleKindLabels[x.kind], fmt(x.tempC, 0, '°C'), fmt(x.durationMin, 0, 'min'), x.agent ?? '—', x.byName ?? '—', stamp(x.at)] })),
      );
    if (s.integrity) {
      integrityTests('Integrity tests before the run', s.integrity.before, 'None recorded.');
      integrityTests('Integrity tests after the run', s.integrity.after, run.status === 'closed' ? 'None recorded.' : 'Not due yet: the run is open.');
      ensure(30);
      text(s.integrity.statement, { bold: true, color: s.integrity.status === 'proven' ? GOOD : BAD, gap: 0.5 });
    }
    chart(s);
    if (s.fit) {
      text(
        `Fitted law: ${lawNames[s.fit.law] ?? s.fit.law}; clean ΔP ${fmt(s.fit.dp0Bar, 3, 'bar')}, K ${s.fit.kPerL.toExponential(3)} per L, r² ${fmt(s.fit.r2, 3)}, ${String(s.fit.n)} readings. Last ΔP ${fmt(s.finalDpBar, 2, 'bar')}; terminal ΔP ${fmt(s.terminalDpBar, 2, 'bar')}.`,
        { gap: 0.4 },
      );
    } else text(`${s.fitNote ?? 'No fit.'} Last ΔP ${fmt(s.finalDpBar, 2, 'bar')}; terminal ΔP ${fmt(s.terminalDpBar, 2, 'bar')}.`, { color: MUTED, gap: 0.4 });
  };

  // —— Title
  text('Bottling filtration record', { bold: true, size: 18, color: ACCENT });
  text(`${record.lot.code} · ${record.lot.name}`, { bold: true, size: 13, gap: 0.4 });
  field('Style', `${record.lot.style}${record.lot.vintage ? `, vintage ${String(record.lot.vintage)}` : ''}`);
  field('Lot volume', fmt(record.lot.volumeL, 0, 'L'));
  field('Runs', String(record.runs.length));

  record.runs.forEach((run, i) => {
    if (i > 0) doc.addPage();
    heading(`Run ${String(i + 1)} of ${String(record.runs.length)}: ${run.status === 'closed' ? 'closed' : 'still open'}`);
    field('Started', whenBy(run.startedAt, run.startedByName));
    field('Closed', run.closedAt ? whenBy(run.closedAt, run.closedByName) : 'Not closed yet');
    field('Filtered', `${fmt(run.volumeFilteredL, 0, 'L')}${run.bottles === null ? '' : ` (${fmt(run.bottles, 0)} bottles of ${fmt(run.plan.bottleMl, 0, 'mL')})`}`);
    field('Override at start', run.overrideReason ? `${run.overrideReason} (${run.overrideByName ?? 'unknown'})` : 'None: the run started without an override.');
    heading('Wine at filtration', 11);
    if (run.analyses) {
      field('Sampled', when(run.analyses.sampledAt));
      field('Turbidity', fmt(run.analyses.turbidityNtu, 1, 'NTU'));
      field('Clogging index', fmt(run.analyses.cloggingIndex, 0, 's'));
      field('Vmax', fmt(run.analyses.vmaxLPerM2, 0, 'L/m²'));
    } else text('No lab result was sampled before the run started.', { color: BAD });
    field('Readiness at start', `${run.readiness.verdict}${run.readiness.reasons.length ? `: ${run.readiness.reasons.join(' ')}` : ''}`);
    field('Judged against', readinessThresholdsLine(run.readiness));
    if (run.readiness.note) text(run.readiness.note, { color: BAD, size: 8.5 });
    heading('Plan and approval', 11);
    field('Plan', `${run.plan.name} (${run.plan.plannedDate})`);
    field('Train', run.plan.trainName || '—');
    field('Line', run.plan.lineName ?? '—');
    field('Approved', run.plan.approvedAt ? whenBy(run.plan.approvedAt, run.plan.approvedByName) : 'Not approved');
    if (run.plan.sizing) {
      const z = run.plan.sizing;
      field('Sized for', `${fmt(z.batchL, 0, 'L')} at ${fmt(z.flowLh, 0, 'L/h')}, ${fmt(z.runHours, 1, 'h')}; pump ${fmt(z.pumpPressureCleanBar, 2, 'bar')} clean, ${fmt(z.pumpPressureEndOfRunBar, 2, 'bar')} at end of run`);
      doc.moveDown(0.3);
      table(
        [
          { label: 'Stage', width: 90 },
          { label: 'Kind', width: 55 },
          { label: 'Cartridges', width: 55, align: 'right' },
          { label: 'Area', width: 50, align: 'right' },
          { label: 'Flux', width: 60, align: 'right' },
          { label: 'Clean ΔP', width: 55, align: 'right' },
          { label: 'Terminal ΔP', width: 60, align: 'right' },
          { label: 'Capacity', width: 65, align: 'right' },
        ],
        z.stages.map((s) => ({
          cells: [s.name, s.kind, String(s.cartridgeCount), fmt(s.areaM2, 2, 'm²'), fmt(s.fluxLmh, 0, 'L/m²h'), fmt(s.cleanDpBar, 3, 'bar'), fmt(s.terminalDpBar, 2, 'bar'), s.capacityL === null ? 'unknown' : fmt(s.capacityL, 0, 'L')],
        })),
      );
    } else text(`No sized figures: ${run.plan.sizingNote ?? 'unknown reason'}`, { color: BAD });
    for (const s of run.stages) stageSection(run, s);
    heading('Readings', 11);
    const readings = run.stages.flatMap((s) => s.readings.map((r) => ({ s, r })));
    if (readings.length === 0) text('No readings were logged.', { color: MUTED });
    else
      table(
        [
          { label: 'Stage', width: 35 },
          { label: 'When (UTC)', width: 80 },
          { label: 'Litres', width: 55, align: 'right' },
          { label: 'Up bar', width: 40, align: 'right' },
          { label: 'Down bar', width: 45, align: 'right' },
          { label: 'ΔP bar', width: 40, align: 'right' },
          { label: 'Flow L/h', width: 45, align: 'right' },
          { label: '°C', width: 30, align: 'right' },
          { label: 'By', width: 70 },
          { label: 'Correction', width: 95 },
        ],
        readings.map(({ s, r }) => {
          const c = r.corrections.at(-1);
          const note = !c
            ? ''
            : c.kind === 'void'
              ? `voided: ${c.reason} (${c.byName ?? '?'})`
              : `corrected to ${fmt(c.volumeL, 0, 'L')}, ${fmt(c.upstreamBar, 2)}/${fmt(c.downstreamBar, 2)} bar: ${c.reason} (${c.byName ?? '?'})`;
          return {
            cells: [String(s.index + 1), stamp(r.at), fmt(r.volumeL, 0), fmt(r.upstreamBar, 2), fmt(r.downstreamBar, 2), fmt(r.dpBar, 2), fmt(r.flowLh, 0), fmt(r.tempC, 1), r.byName ?? '—', note],
            color: c ? [MUTED, MUTED, MUTED, MUTED, MUTED, MUTED, MUTED, MUTED, MUTED, BAD] : undefined,
          };
        }),
      );
    heading('Closing notes', 11);
    text(run.notes.trim() || 'No closing notes.', { color: run.notes.trim() ? INK : MUTED });
  });

  // —— Footer on every page: fingerprint and the time this copy was made.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const saved = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - MARGIN - FOOTER + 14;
    doc.moveTo(left, y - 4).lineTo(left + width(), y - 4).lineWidth(0.5).strokeColor(RULE).stroke();
    doc.font('body').fontSize(7.5).fillColor(MUTED);
    doc.text(`Fingerprint (SHA-256) ${record.fingerprint}`, left, y, { width: width(), lineBreak: false });
    doc.text(`Made ${when(record.generatedAt)} · Lot ${record.lot.code} · Page ${String(i - range.start + 1)} of ${String(range.count)} · Check at /api/records/verify`, left, y + 11, {
      width: width(),
      lineBreak: false,
    });
    doc.page.margins.bottom = saved;
  }
  doc.end();
  return done;
}
