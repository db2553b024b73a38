import fc from 'fast-check';
import { arbAdversarialDraw, buildAdversarial } from './dist/corpus/generators/adversarial.js';
import { checkModel } from './dist/harness/check/checkModel.js';
import { buildModel } from './dist/corpus/format/build.js';
const N = Number(process.argv[2] ?? 40);
const methods = (process.argv[3] ?? 'uniformization,euler,kstep:1,kstep:2,kstep:3').split(',');
const draws = fc.sample(arbAdversarialDraw({ maxStates: 10 }), { seed: 7, numRuns: N });
let fails = 0;
for (const d of draws) {
  const { model, features } = buildAdversarial(d, 10);
  const t = performance.now();
  const r = await checkModel('x', buildModel(model), [], { precision: 1e-5, methods: [...methods, 'kstep:4'], methodPrecision: { 'kstep:4': 1e-9 }, solvers: [] });
  const bad = r.checks.filter((c) => !c.passed);
  const refused = r.methods.filter((m) => m.status !== 'solved').map((m) => m.label);
  const prec = r.methods.filter((m) => m.status === 'solved' && m.precision > 1e-5 && m.label !== 'kstep:4' || (m.label==='kstep:4' && m.precision>1e-9)).map((m) => `${m.label}@${m.precision}`);
  if (bad.length) fails++;
  console.log(((performance.now() - t) / 1000).toFixed(2), JSON.stringify(features), 'refused:', refused.join(','), 'coarse:', prec.join(','), bad.length ? 'FAIL ' + bad.map((c) => c.name + ': ' + c.detail).join(' | ') : '');
}
console.log('fails', fails);
