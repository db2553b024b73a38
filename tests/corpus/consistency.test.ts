/**
 * The bundled corpus is consistent: every file is named after the model inside it (`name:`, or the
 * name its generator gives), and no file raises a warning of its own, so that a warning a user sees
 * comes from the user's model. The random-game family, whose draws may contain actions without
 * successors, writes them as self-loops; checked over many seeds.
 */
import { basename, extname } from 'node:path';
import { describe, expect, test } from 'vitest';
import { loadModelFileWithWarnings, validateModelObject } from '../../corpus/format/load.js';
import { generateModel } from '../../corpus/generators/index.js';
import { collectModelFiles } from '../../harness/check/collect.js';

const FOLDERS = ['corpus/models', 'corpus/generated', 'corpus/oracle-cases', 'corpus/regressions'];
const files = collectModelFiles(FOLDERS);

describe('the bundled corpus', () => {
  test('has files in every folder (the list below is not empty by mistake)', () => {
    for (const folder of FOLDERS) expect(files.some((f) => f.startsWith(`${folder}/`))).toBe(true);
  });
  test.each(files)('%s: file name equals model name, no warnings', (file) => {
    const { model, warnings } = loadModelFileWithWarnings(file);
    expect(warnings).toEqual([]);
    expect(model.name).toBe(basename(file, extname(file)));
  });
  test('the whole corpus (collected as check collects it) is exactly these folders', () => {
    expect(collectModelFiles(['corpus']).sort()).toEqual([...files].sort());
  });
});

describe('random-game family', () => {
  test('no action without successors in 40 seeds (they become self-loops)', () => {
    for (let seed = 1; seed <= 40; seed++) {
      const obj = generateModel({ family: 'random-game', seed, states: 8, actions: 3, successors: 3 });
      const { warnings } = validateModelObject(obj, `random-game-${seed}`);
      expect(warnings).toEqual([]);
    }
  });
});
