/**
 * The k-step scheme's stated bound (per interval the smaller of its a-priori and its a-posteriori
 * truncation bound, solvers/kstep/aposteriori.ts, plus rounding) beside the certificate of its level-k pieces
 * (harness/check/certified.ts), and the actual error against the oracle, on corpus models.
 *
 *   npx tsc -p . && node dist/bench/kstep-certified.js [precision] [model ...]
 *
 * Columns: model, k, intervals, certified steps, stated bound, certified bound X (on |value − true|,
 * every state), X / stated, actual error (largest |value − oracle| beyond the oracle's bound).
 */
import { compile } from '../corpus/format/compile.js';
import { loadModelFile } from '../corpus/format/load.js';
import { CertifySink, certifiedBound } from '../harness/check/certified.js';
import { solveOracle } from '../oracles/index.js';
import { solveKstep } from '../solvers/kstep/index.js';

const precision = Number(process.argv[2] ?? 1e-6);
const files = process.argv.length > 3 ? process.argv.slice(3) : ['corpus/models/ferry-crossing.yaml', 'corpus/models/thermostat-duel.yaml', 'corpus/models/relay-race.yaml'];
const e = (x: number): string => x.toExponential(2);
console.log(['model', 'k', 'intervals', 'steps', 'stated', 'certified', 'cert/stated', 'actual'].join('\t'));
for (const file of files) {
  const model = loadModelFile(file);
  const m = compile(model);
  const ref = solveOracle(model, { digits: 25 });
  for (const k of [2, 3, 4]) {
    const sink = new CertifySink('pieces', 1e9);
    const out = solveKstep(m, { precision, k, dense: sink });
    if (out.kind !== 'solved') {
      console.log(`${model.name}\t${k}\trefused: ${out.reason}`);
      continue;
    }
    const cert = sink.result();
    const X = cert?.status === 'certified' ? certifiedBound(out.values, cert).bound : NaN;
    let actual = NaN;
    if (ref.kind === 'solved') {
      actual = 0;
      out.values.forEach((v, s) => (actual = Math.max(actual, Math.abs(v - ref.values[s]!) - ref.errorBound)));
    }
    console.log([model.name, k, out.stats.intervals, cert?.status === 'certified' ? cert.steps : '-', e(out.errorBound), e(X), (X / out.errorBound).toPrecision(3), e(Math.max(actual, 0))].join('\t'));
  }
}
