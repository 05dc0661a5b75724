// The shape every group of request handlers fills in: one async function per request name,
// receiving arguments that have already passed their JSON Schema.
import type { RequestArgs, RequestName, RequestResult } from '../sim/bridge/bridge-contract.ts';

export type HandlerTable = { [K in RequestName]: (args: RequestArgs<K>) => Promise<RequestResult<K>> };
