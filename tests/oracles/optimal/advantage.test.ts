/**
 * The certified first-exceedance search on polynomials with known roots (common practice, no
 * source): a simple crossing, a double crossing inside one cell (a grid would miss it), and a
 * tangency (a double root that never exceeds the tolerance).
 */
import { describe, expect, it } from 'vitest';
import { decimalAt } from '../../../oracles/common/decModel.js';
import { firstExceed } from '../../../oracles/optimal/advantage.js';

const D = decimalAt(50);
const poly = (cs: (number | string)[]) => cs.map((c) => new D(c));
const tol = 1e-42;
const wMin = 1e-44;

describe('firstExceed', () => {
  it('finds a simple crossing of −0.3 + σ at 0.3 to the working precision', () => {
    const r = firstExceed(D, poly([-0.3, 1]), tol, wMin);
    expect(r.at!.minus('0.3').abs().toNumber()).toBeLessThan(1e-40);
  });

  it('finds the first of two crossings inside the cell: −(σ − 0.4)(σ − 0.41) > 0 on (0.4, 0.41)', () => {
    // −σ² + 0.81σ − 0.164: negative at both ends of [0, 1], positive only on (0.4, 0.41).
    const r = firstExceed(D, poly(['-0.164', '0.81', -1]), tol, wMin);
    // The point found is where P first exceeds tol = 1e-42; with slope 0.01 that is 1e-40 past 0.4.
    expect(r.at!.minus('0.4').abs().toNumber()).toBeLessThan(2e-40);
  });

  it('reports no exceedance for a tangency −(σ − 0.5)², with a negligible unresolved bound', () => {
    const r = firstExceed(D, poly(['-0.25', 1, -1]), tol, wMin);
    expect(r.at).toBeUndefined();
    expect(r.unresolved).toBeLessThan(1e-80);
    expect(r.nodes).toBeLessThan(2000);
  });

  it('sees a positive excursion of height 1e-30 over width 2e-15', () => {
    // −(σ − 0.7)² + 1e-30: positive on 0.7 ± 1e-15.
    const r = firstExceed(D, poly(['-0.49' , '1.4', -1].map((x, i) => (i === 0 ? new D(x).plus('1e-30').toString() : x))), tol, wMin);
    // P exceeds tol = 1e-42 at 0.7 − √(1e-30 − 1e-42) ≈ 0.7 − 1e-15 + 5e-28 (slope 2e-15 there).
    expect(r.at!.minus('0.7').plus('1e-15').minus('5e-28').abs().toNumber()).toBeLessThan(1e-35);
    expect(r.unresolved).toBeLessThan(1e-50);
  });
});
