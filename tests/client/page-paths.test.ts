import { describe, expect, it } from 'vitest';
import type { RouteObject } from 'react-router-dom';
import { PAGE_PATTERNS, paths } from '@shared/paths';
import { routes } from '@/app/routes-table';

/** Every page path the router knows, as absolute patterns. */
function routerPaths(list: RouteObject[], prefix = ''): string[] {
  return list.flatMap((r) => {
    const own = r.index ? [prefix || '/'] : r.path && r.path !== '*' ? [`${prefix}/${r.path}`] : [];
    const base = r.path && r.path !== '*' ? `${prefix}/${r.path}` : prefix;
    return [...own, ...routerPaths(r.children ?? [], base)];
  });
}

describe('page paths live in one place', () => {
  it('the router serves exactly the pages in shared/paths.ts, once each', () => {
    const served = routerPaths(routes);
    expect(new Set(served).size).toBe(served.length);
    expect([...served].sort()).toEqual(Object.values(PAGE_PATTERNS).sort());
  });

  it('the builders make addresses the router matches, with hostile slugs kept inside one segment', () => {
    expect(paths.guide('stock-2wd')).toBe('/guides/stock-2wd');
    expect(paths.guideVersion('stock-2wd', 3)).toBe('/guides/stock-2wd/v/3');
    expect(paths.documentCompare('guide', 'a', 1, 2)).toBe('/guides/a/compare?from=1&to=2');
    expect(paths.parameter('drag-brake')).toBe('/parameters/drag-brake');
    expect(paths.guide('../admin/users?x=1#y')).toBe('/guides/..%2Fadmin%2Fusers%3Fx%3D1%23y');
    expect(paths.editor('guide', 'a', 'r1', true)).toBe('/guides/new?draft=r1');
    expect(paths.editor('parameter', 'drag-brake', 'r 1', false)).toBe('/parameters/drag-brake/edit?draft=r%201');
    expect(paths.search('a&b=c')).toBe('/search?q=a%26b%3Dc');
  });
});
