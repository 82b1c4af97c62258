import { describe, expect, it } from 'vitest';
import { signInInputSchema, signUpInputSchema, updateMeInputSchema } from './auth';
import { listQuerySchema, PAGE_SIZE_MAX } from './list';
import { createInvitationInputSchema } from './team';

describe('sign-up schema', () => {
  it('normalises the e-mail and trims names', () => {
    const parsed = signUpInputSchema.parse({ name: '  Ada  ', email: ' Ada@Winery.TEST ', password: 'long-enough-pw', wineryName: ' Hill ' });
    expect(parsed).toEqual({ name: 'Ada', email: 'ada@winery.test', password: 'long-enough-pw', wineryName: 'Hill' });
  });

  it.each([
    [{ name: '', email: 'a@b.test', password: 'long-enough-pw', wineryName: 'W' }, 'name'],
    [{ name: 'A', email: 'nope', password: 'long-enough-pw', wineryName: 'W' }, 'email'],
    [{ name: 'A', email: 'a@b.test', password: 'short', wineryName: 'W' }, 'password'],
    [{ name: 'A', email: 'a@b.test', password: 'long-enough-pw', wineryName: '   ' }, 'wineryName'],
  ])('names the wrong field', (input, field) => {
    const result = signUpInputSchema.safeParse(input);
    expect(result.success).toBe(false);
    expect(result.error!.issues[0].path).toEqual([field]);
  });
});

describe('other auth schemas', () => {
  it('sign-in needs a password but does not judge its length', () => {
    expect(signInInputSchema.safeParse({ email: 'a@b.test', password: 'x' }).success).toBe(true);
    expect(signInInputSchema.safeParse({ email: 'a@b.test', password: '' }).success).toBe(false);
  });

  it('updating me needs at least one change', () => {
    expect(updateMeInputSchema.safeParse({}).success).toBe(false);
    expect(updateMeInputSchema.safeParse({ units: 'us' }).success).toBe(true);
  });

  it('invitations name a known role', () => {
    expect(createInvitationInputSchema.safeParse({ email: 'a@b.test', role: 'technician' }).success).toBe(true);
    expect(createInvitationInputSchema.safeParse({ email: 'a@b.test', role: 'boss' }).success).toBe(false);
  });
});

describe('list query schema', () => {
  const schema = listQuerySchema(['name', 'createdAt'], 'name');

  it('fills defaults and coerces numbers from the query string', () => {
    expect(schema.parse({})).toEqual({ q: undefined, sort: 'name', order: 'asc', page: 1, pageSize: 25 });
    expect(schema.parse({ q: ' pp ', sort: 'createdAt', order: 'desc', page: '3', pageSize: '50' })).toEqual({
      q: 'pp',
      sort: 'createdAt',
      order: 'desc',
      page: 3,
      pageSize: 50,
    });
  });

  it.each([
    [{ sort: 'password' }, 'sort'],
    [{ order: 'sideways' }, 'order'],
    [{ page: '0' }, 'page'],
    [{ pageSize: String(PAGE_SIZE_MAX + 1) }, 'pageSize'],
  ])('refuses %o', (query, field) => {
    const result = schema.safeParse(query);
    expect(result.success).toBe(false);
    expect(result.error!.issues[0].path).toEqual([field]);
  });
});
