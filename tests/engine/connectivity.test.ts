import { describe, expect, it } from 'vitest';
import { canBeMade, connectivity } from '../../shared/engine/connectivity.js';
import type { Joint, JointKind } from '../../shared/engine/model.js';

function joint(a: string, b: string, kind: JointKind = 'mortise-and-tenon', orthogonal = true): Joint {
  return { a, b, kind, angleDeg: orthogonal ? 90 : 72, length: 10, orthogonal, from: [0, 0, 0], to: [10, 0, 0], slots: [] };
}

describe('canBeMade', () => {
  it('accepts orthogonal joints of every kind but locked-crossing', () => {
    expect(canBeMade(joint('a', 'b', 'corner'))).toBe(true);
    expect(canBeMade(joint('a', 'b', 'cross-lap'))).toBe(true);
    expect(canBeMade(joint('a', 'b', 'through-slot'))).toBe(true);
    expect(canBeMade(joint('a', 'b', 'locked-crossing'))).toBe(false);
    expect(canBeMade(joint('a', 'b', 'corner', false))).toBe(false);
  });
});

describe('connectivity', () => {
  it('when a chain links every piece, there is one group', () => {
    const c = connectivity(['p3', 'p1', 'p2'], [joint('p1', 'p2'), joint('p2', 'p3')]);
    expect(c.components).toBe(1);
    expect(c.groups).toEqual([['p1', 'p2', 'p3']]);
  });

  it('when the only link is non-orthogonal or locked, the pieces stay apart', () => {
    const c = connectivity(['a', 'b', 'c', 'd'], [joint('a', 'b', 'corner', false), joint('c', 'd', 'locked-crossing'), joint('b', 'c')]);
    expect(c.components).toBe(3);
    expect(c.groups).toEqual([['b', 'c'], ['a'], ['d']]);
  });

  it('when there are no pieces, there are no components', () => {
    expect(connectivity([], [])).toEqual({ components: 0, groups: [] });
  });

  it('ignores joints naming unknown pieces and counts duplicate ids once', () => {
    const c = connectivity(['a', 'a', 'b'], [joint('a', 'zz'), joint('zz', 'b')]);
    expect(c.components).toBe(2);
    expect(c.groups).toEqual([['a'], ['b']]);
  });

  it('orders groups largest first, ties by first id', () => {
    const c = connectivity(['e', 'd', 'c', 'b', 'a'], [joint('d', 'e'), joint('a', 'b')]);
    expect(c.groups).toEqual([['a', 'b'], ['d', 'e'], ['c']]);
  });
});
