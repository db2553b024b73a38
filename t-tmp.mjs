import fc from 'fast-check';
import { arbAdversarialDraw, buildAdversarial } from './dist/corpus/generators/adversarial.js';
const draws = fc.sample(arbAdversarialDraw(), { seed: 1, numRuns: 6 });
for (const d of draws) { const { model, features } = buildAdversarial(d); console.log(JSON.stringify(features)); console.log(JSON.stringify(model.states), model.time_bound); }
