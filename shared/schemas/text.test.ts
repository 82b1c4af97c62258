import { describe, expect, it } from 'vitest';
import { checkJsonShape, findIllFormedText, isWellFormedText, textSchema } from './text';

describe('well-formed text', () => {
  it('refuses NUL and lone surrogates, accepts pairs (common practice, no source: UTF-16 rules)', () => {
    expect(isWellFormedText('Chardonnay 🍇')).toBe(true);
    expect(isWellFormedText('a\u0000b')).toBe(false);
    expect(isWellFormedText('\ud800')).toBe(false);
    expect(isWellFormedText('\udc00x')).toBe(false);
    expect(isWellFormedText('\ud83c\udf47')).toBe(true);
  });

  it('textSchema is a zod string with the same rule', () => {
    expect(textSchema().max(5).safeParse('ok').success).toBe(true);
    const bad = textSchema().safeParse('x\ud800');
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0].message).toMatch(/surrogate/);
    expect(textSchema().safeParse('x\u0000').error?.issues[0].message).toMatch(/NUL/);
  });

  it('findIllFormedText names the path, keys included', () => {
    expect(findIllFormedText({ a: [{ b: 'fine' }, { c: 'x\u0000' }] })).toEqual({ path: 'a.1.c', message: expect.stringMatching(/NUL/) });
    expect(findIllFormedText({ ['k\ud800']: 1 })?.path).toBe('_');
    expect(findIllFormedText({ a: 1, b: [true, null, 'ok'] })).toBeNull();
  });
});

describe('checkJsonShape', () => {
  it('measures depth and items without parsing; brackets in strings do not count', () => {
    expect(checkJsonShape('[[[]]]', 3)).toBeNull();
    expect(checkJsonShape('[[[[]]]]', 3)?.kind).toBe('depth');
    expect(checkJsonShape('{"a":"[[[[[[\\"]]"}', 2)).toBeNull();
    expect(checkJsonShape('[1,2,3,4]', 32, 2)?.kind).toBe('elements');
    expect(checkJsonShape(new TextEncoder().encode('[[["é"]]]'), 2)?.kind).toBe('depth');
  });
});
