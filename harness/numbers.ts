/**
 * How crossbound writes a number, in every message, table and report: one module, so that a value, a
 * bound and a ratio read the same wherever they appear (never a 20-digit double beside a 3-digit one).
 *
 * - values (probabilities): 10 significant digits, `0.2637042676`, `2.420721375e-5`;
 * - errors, bounds, differences, precisions: 3 significant digits in exponent form, `2.42e-5`;
 * - ratios: 3 significant digits, never rounded across 1;
 * - plain magnitudes (λT, rates): 3 significant digits;
 * - durations: `0.0310 s`, `12.3 s`, `2 min 03 s`.
 * Exponents are written without `+` and without leading zeros: `1.00e6`, `2.42e-5`.
 */

const tidyExponent = (s: string): string => s.replace('e+', 'e');

function nonFinite(x: number): string | undefined {
  if (Number.isNaN(x)) return 'NaN';
  if (x === Infinity) return 'inf';
  if (x === -Infinity) return '-inf';
  return undefined;
}

/** A value v_s(T): ten significant digits. */
export function formatValue(x: number): string {
  return nonFinite(x) ?? (x === 0 ? '0' : tidyExponent(x.toPrecision(10)));
}

/** An error, bound or difference: `digits` significant digits (default 3) in exponent form. */
export function formatError(x: number, digits = 3): string {
  return nonFinite(x) ?? (x === 0 ? '0' : tidyExponent(x.toExponential(digits - 1)));
}

/** A requested precision: the shortest exponent form that reads back as the same double (`1e-6`, `2.5e-7`). */
export function formatPrecision(p: number): string {
  return nonFinite(p) ?? tidyExponent(p.toExponential().replace(/\.0+e/, 'e'));
}

/** A plain magnitude such as λT or a rate: three significant digits, exponent form outside [1e-3, 1e6). */
export function formatScalar(x: number): string {
  const bad = nonFinite(x);
  if (bad) return bad;
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a >= 1e-3 && a < 1e6 ? String(Number(x.toPrecision(3))) : tidyExponent(x.toExponential(2));
}

/**
 * A ratio as reports show it: three significant digits, never rounded across 1 (0.9995 is `0.999`,
 * 1.0004 is `1.0004`), so a passing check never reads as `1.00` and a failing one never as `1.00` either.
 */
export function formatRatio(r: number): string {
  if (!Number.isFinite(r)) return Number.isNaN(r) ? 'NaN' : 'inf';
  if (r === 0) return '0';
  if (r < 1e-3 || r >= 1e4) return tidyExponent(r.toExponential(2));
  let s = r.toPrecision(3);
  if (r < 1 && Number(s) >= 1) s = '0.999';
  for (let p = 4; r > 1 && Number(s) <= 1 && p <= 17; p++) s = r.toPrecision(p);
  return s;
}

/** A duration in seconds. */
export function formatSeconds(s: number): string {
  const bad = nonFinite(s);
  if (bad) return bad;
  if (s < 60) return `${s === 0 ? '0' : tidyExponent(s.toPrecision(3))} s`;
  const whole = Math.round(s);
  const h = Math.floor(whole / 3600);
  const m = Math.floor((whole % 3600) / 60);
  const sec = String(whole % 60).padStart(2, '0');
  return h > 0 ? `${h} h ${String(m).padStart(2, '0')} min ${sec} s` : `${m} min ${sec} s`;
}
