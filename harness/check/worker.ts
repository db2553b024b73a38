/** A worker thread of `check --jobs N`: checks one model file and returns its report (plain data). */
import { loadModelFileWithWarnings } from '../../corpus/format/load.js';
import { checkModel, type CheckOptions } from './checkModel.js';
import { loadPlantedFor } from './planted.js';
import type { ModelReport } from './types.js';

export default async function checkFile(task: { file: string; opts: CheckOptions }): Promise<ModelReport> {
  await loadPlantedFor(task.opts.methods ?? []);
  const { model, warnings } = loadModelFileWithWarnings(task.file);
  return checkModel(task.file, model, warnings, task.opts);
}
