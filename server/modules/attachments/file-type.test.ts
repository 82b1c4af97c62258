import { describe, expect, it } from 'vitest';
import { safeFileName, sniffFileType } from './file-type';

const bytes = (...b: number[]) => new Uint8Array(b);
const text = (s: string) => new TextEncoder().encode(s);

describe('sniffFileType', () => {
  it.each([
    ['PDF', text('%PDF-1.7\n%âãÏÓ'), 'pdf'],
    ['PNG', bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13), 'png'],
    ['JPEG', bytes(0xff, 0xd8, 0xff, 0xe0, 0, 16), 'jpeg'],
    ['CSV text', text('serial,batch\nQW-1,B1\n'), 'csv'],
    ['CSV with accents', text('lot,note\nL1,rosé prêt\n'), 'csv'],
  ])('recognises %s by content', (_label, content, kind) => {
    expect(sniffFileType(content)?.kind).toBe(kind);
  });

  it.each([
    ['a Windows executable', bytes(0x4d, 0x5a, 0x90, 0x00, 0x03)],
    ['binary with NUL bytes', bytes(1, 2, 0, 4)],
    ['an empty file', bytes()],
    ['invalid UTF-8', bytes(0xc3, 0x28, 0x41)],
  ])('refuses %s', (_label, content) => {
    expect(sniffFileType(content)).toBeNull();
  });
});

describe('safeFileName', () => {
  it.each([
    ['../../etc/passwd', 'passwd'],
    ['C:\\reports\\lab report.pdf', 'lab report.pdf'],
    ['"quoted";name.pdf', '_quoted_name.pdf'],
    ['...', 'file'],
  ])('%s → %s', (input, output) => {
    expect(safeFileName(input)).toBe(output);
  });
});
