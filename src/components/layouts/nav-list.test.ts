import { describe, expect, it } from 'vitest';
import { currentNavItem, type NavListItem } from './nav-list';

const items: NavListItem[] = ['/today', '/runs', '/records', '/records/changes'].map((to) => ({ to, label: to, icon: null }));

describe('currentNavItem', () => {
  it('marks the most specific link whose address starts the page’s', () => {
    expect(currentNavItem(items, '/records/changes')).toBe('/records/changes');
    expect(currentNavItem(items, '/records/lots/7')).toBe('/records');
    expect(currentNavItem(items, '/records')).toBe('/records');
    expect(currentNavItem(items, '/records/')).toBe('/records');
    expect(currentNavItem(items, '/runs/42')).toBe('/runs');
  });

  it('marks nothing for a page outside the nav, and never a prefix of a word', () => {
    expect(currentNavItem(items, '/settings')).toBeUndefined();
    expect(currentNavItem(items, '/runsheet')).toBeUndefined();
  });
});
