/** What a file really is, from its first bytes (never from its name alone). */
export type SniffedType = { kind: 'pdf' | 'png' | 'jpeg' | 'csv'; contentType: string; extensions: string[] };

const startsWith = (buf: Uint8Array, bytes: number[]) => bytes.every((b, i) => buf[i] === b);

function looksLikeText(buf: Uint8Array) {
  if (buf.length === 0) return false;
  const sample = buf.subarray(0, 64 * 1024);
  if (sample.includes(0)) return false;
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(sample.length === buf.length ? sample : buf.subarray(0, lastCharBoundary(sample)));
    return true;
  } catch {
    return false;
  }
}

/** Stops a sample before a multi-byte UTF-8 character cut in half. */
function lastCharBoundary(sample: Uint8Array) {
  let end = sample.length;
  while (end > 0 && (sample[end - 1] & 0xc0) === 0x80) end -= 1;
  return end > 0 && sample[end - 1] >= 0xc0 ? end - 1 : sample.length;
}

/** PDF, PNG and JPEG by their signatures; CSV as UTF-8 text without NUL bytes. */
export function sniffFileType(buf: Uint8Array): SniffedType | null {
  if (startsWith(buf, [0x25, 0x50, 0x44, 0x46, 0x2d])) return { kind: 'pdf', contentType: 'application/pdf', extensions: ['pdf'] };
  if (startsWith(buf, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return { kind: 'png', contentType: 'image/png', extensions: ['png'] };
  if (startsWith(buf, [0xff, 0xd8, 0xff])) return { kind: 'jpeg', contentType: 'image/jpeg', extensions: ['jpg', 'jpeg'] };
  if (looksLikeText(buf)) return { kind: 'csv', contentType: 'text/csv', extensions: ['csv'] };
  return null;
}

/** A file name safe to store and to send back in Content-Disposition. */
export function safeFileName(name: string) {
  const base = name.split(/[\\/]/).pop() ?? 'file';
  const cleaned = base.replace(/[^\p{L}\p{N} ._()-]+/gu, '_').replace(/^\.+/, '').slice(0, 120).trim();
  return cleaned || 'file';
}
