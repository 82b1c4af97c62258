// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { loggerMappingSchema } from '@shared/schemas/logger';
import { decodeSample, draftToMapping, guessDraft, mappingToDraft, sampleFile } from './mapping-draft';

const european = 'Gerät;DL-7\r\nDatum/Zeit;Zähler hL;P vor (psi);P nach (psi);Temp °F\r\n14.03.2026 08:00:00;1.250,00;20,0;14,5;50,0\r\n';

describe('the mapping form’s first guess', () => {
  it('finds the header row after a preamble, the separator, the decimal mark, the columns and their units', () => {
    const sample = sampleFile(european);
    expect(sample.headers).toEqual(['Datum/Zeit', 'Zähler hL', 'P vor (psi)', 'P nach (psi)', 'Temp °F']);
    const d = guessDraft(sample);
    expect(d).toMatchObject({
      delimiter: ';',
      decimal: ',',
      timeColumn: 'Datum/Zeit',
      litresFrom: 'totaliser',
      litresColumn: 'Zähler hL',
      litresUnit: 'hL',
      pressures: 'pair',
      upstreamColumn: 'P vor (psi)',
      upstreamUnit: 'psi',
      downstreamColumn: 'P nach (psi)',
      tempColumn: 'Temp °F',
      tempUnit: 'degF',
    });
    const m = loggerMappingSchema.parse(draftToMapping({ ...d, timeZone: 'Europe/Vienna' }));
    expect(mappingToDraft(m, d)).toEqual({ ...d, timeZone: 'Europe/Vienna' });
  });

  it('reads a Windows-1252 file as the server does, so the column names match', () => {
    const bytes = Uint8Array.from([...'Zeit;Z'].map((c) => c.charCodeAt(0)).concat([0xe4], [...'hler\n'].map((c) => c.charCodeAt(0))));
    expect(decodeSample(bytes)).toBe('Zeit;Zähler\n');
    expect(decodeSample(new TextEncoder().encode('Zeit;Zähler\n'))).toBe('Zeit;Zähler\n');
  });
});
