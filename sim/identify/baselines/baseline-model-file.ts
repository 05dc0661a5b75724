// Reads and writes baseline model files. Writing is atomic; reading checks the file against
// BASELINE_MODEL_SCHEMA and that every linear operator has the size its layout implies, and
// words each failure with the file and JSON pointer.
import type { ValidateFunction } from 'ajv';
import Ajv2020 from 'ajv/dist/2020.js';

import { writeFileAtomic } from '../../dataset/formats/atomic-file.ts';
import { MiB, readBoundedText } from '../../dataset/formats/bounded-text-file.ts';
import { DatasetRequestError } from '../../dataset/formats/dataset-request-error.ts';
import { BaselineInputError } from './baseline-input-error.ts';

/** Below V8's longest string (about 512 MiB), so an oversized file is refused, not a crash. */
const MAX_MODEL_FILE_BYTES = 256 * MiB;
import type { BaselineModel } from './baseline-model.ts';
import { BASELINE_MODEL_SCHEMA } from './baseline-model-schema.ts';
import { snapshotSize, stateSize } from './linear-state.ts';

let compiled: ValidateFunction | undefined;

function validator(): ValidateFunction {
  compiled ??= new Ajv2020({ strict: true, strictTypes: false, strictRequired: false, allErrors: true }).compile(BASELINE_MODEL_SCHEMA);
  return compiled;
}

export function writeBaselineModel(path: string, model: BaselineModel): void {
  writeFileAtomic(path, new TextEncoder().encode(`${JSON.stringify(model, null, 1)}\n`));
}

export async function readBaselineModel(path: string): Promise<BaselineModel> {
  let text: string;
  try {
    text = readBoundedText(path, MAX_MODEL_FILE_BYTES, `${path}: the model file`);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw new BaselineInputError(error.message);
    const code = (error as { code?: string }).code ?? 'unreadable';
    throw new BaselineInputError(`${path}: the model file cannot be read (${code}); give the file \`pliant baseline fit --out\` wrote`);
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (error) {
    throw new BaselineInputError(`${path}: not valid JSON (${error instanceof Error ? error.message : String(error)}); write it again with \`pliant baseline fit\``);
  }
  return checkBaselineModel(parsed, path);
}

export function checkBaselineModel(parsed: unknown, path: string): BaselineModel {
  const validate = validator();
  if (!validate(parsed)) {
    const problems = [...new Set((validate.errors ?? []).filter((e) => e.keyword !== 'if').map((e) => `${e.instancePath || '/'}: ${e.message ?? 'is not valid'}`))];
    throw new BaselineInputError(`${path} is not a baseline model file:\n  ${problems.slice(0, 8).join('\n  ')}\nWrite it again with \`pliant baseline fit\``);
  }
  const model = parsed as BaselineModel;
  model.linear?.groups.forEach((group, g) => {
    const layout = { nodeCount: group.nodeCount, channelCount: group.channelCount, delays: model.linear!.delays, affine: model.linear!.affine, stateForm: model.linear!.stateForm };
    const rows = stateSize(layout);
    const columns = snapshotSize(layout);
    const op = group.operator;
    if (op.rows !== rows || op.columns !== columns || op.data.length !== rows * columns) {
      throw new BaselineInputError(`${path} (/linear/groups/${g}/operator): holds ${op.rows} × ${op.columns} with ${op.data.length} numbers, but ${group.nodeCount} nodes, ${group.channelCount} channels and ${model.linear!.delays} delays need ${rows} × ${columns}; write it again with \`pliant baseline fit\``);
    }
  });
  return model;
}
