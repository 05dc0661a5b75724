// The renderer's desktop bridge and its array decoding. The bridge is driven through a
// stand-in for the preload's window.pliantBridge that forwards to the real request registry, as
// IPC would. Base64 is checked on the RFC 4648 section 10 test vectors; typed-array decoding
// against Debian's NumPy (/usr/bin/python3), which writes the little-endian C-order bytes the
// contract specifies.
import { mkdtempSync, realpathSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDefaultServices } from '../electron/default-services.ts';
import { createNativeFolderChooser } from '../electron/folder-dialog.ts';
import { createRequestHandlers } from '../electron/request-handlers.ts';
import { BridgeRequestError } from '../renderer/bridge/bridge-request-error.ts';
import { base64ToBytes, decodeArray } from '../renderer/bridge/decode-array.ts';
import { createElectronBridge } from '../renderer/bridge/electron-bridge.ts';
import type { ArrayDtype, BridgeEvent, PreloadBridgeApi, RequestName, RequestReply } from '../sim/bridge/bridge-contract.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

let root: string;
beforeAll(() => {
  root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-ebridge-')));
});
afterAll(() => rmSync(root, { recursive: true, force: true }));

async function bridgeOverRegistry() {
  const services = await createDefaultServices({
    mode: 'desktop',
    version: '0.1.0',
    bundledScenariosDir: join(root, 'none'),
    folderChooser: createNativeFolderChooser(async () => ({ canceled: false, filePaths: [root] })),
  });
  const handlers = createRequestHandlers(services);
  const preload: PreloadBridgeApi = {
    // structuredClone stands for the IPC copy: the registry never shares objects with the page.
    invoke: async (name, args) => structuredClone(await handlers.handle(name, structuredClone(args))),
    onEvent: (listener: (event: BridgeEvent) => void) => handlers.onEvent(listener),
  };
  return createElectronBridge(preload);
}

describe('electron bridge', () => {
  it('resolves with the result of a request', async () => {
    const bridge = await bridgeOverRegistry();
    expect(bridge.transport).toBe('electron');
    expect(await bridge.invoke('folder.choose', { purpose: 'export' })).toEqual({ path: root });
    const written = await bridge.invoke('scenario.write', { path: join(root, 'korrin-bay-tether.json'), text: '{}' });
    expect(written).toEqual({ path: join(root, 'korrin-bay-tether.json'), bytes: 2 });
  });

  it('rejects with a BridgeRequestError carrying the registry\'s code and message', async () => {
    const bridge = await bridgeOverRegistry();
    const failure = await bridge.invoke('scenario.read', { path: '/etc/passwd.json' }).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(BridgeRequestError);
    expect(failure).toMatchObject({ code: 'path-refused' });
    expect((failure as Error).message).toMatch(/outside the folders chosen in this session/);
  });

  it('turns a broken or silent main process into shell-unreachable', async () => {
    const silent = createElectronBridge({ invoke: () => Promise.reject(new Error('No handler registered for pliant:request')), onEvent: () => () => undefined });
    await expect(silent.invoke('app.info', {})).rejects.toMatchObject({ code: 'shell-unreachable' });
    const nonsense = createElectronBridge({ invoke: async () => ({ surprise: true }) as unknown as RequestReply<RequestName>, onEvent: () => () => undefined });
    await expect(nonsense.invoke('app.info', {})).rejects.toMatchObject({ code: 'shell-unreachable' });
  });
});

describe('base64 decoding (RFC 4648 section 10 test vectors)', () => {
  it.each([
    ['', ''],
    ['Zg==', 'f'],
    ['Zm8=', 'fo'],
    ['Zm9v', 'foo'],
    ['Zm9vYg==', 'foob'],
    ['Zm9vYmE=', 'fooba'],
    ['Zm9vYmFy', 'foobar'],
  ])('decodes "%s" to "%s"', (encoded, plain) => {
    expect(Array.from(base64ToBytes(encoded))).toEqual(Array.from(Buffer.from(plain, 'latin1')));
  });
});

describe('typed-array decoding against NumPy (/usr/bin/python3)', () => {
  const python = referencePythonAvailability();
  const cases: { dtype: ArrayDtype; numpy: string; values: number[]; shape: number[] }[] = [
    { dtype: 'float64', numpy: '<f8', values: [0.1, -2.5, 1e-300, 6.02214076e23, 0, -1.5e-8], shape: [2, 3] },
    { dtype: 'float32', numpy: '<f4', values: [0.1, -2.5, 3.4028234663852886e38, 1e-45], shape: [4] },
    { dtype: 'int32', numpy: '<i4', values: [-2147483648, 2147483647, -1, 0], shape: [2, 2] },
    { dtype: 'uint32', numpy: '<u4', values: [4294967295, 0, 123456789], shape: [3] },
    { dtype: 'int16', numpy: '<i2', values: [-32768, 32767, -2], shape: [3] },
    { dtype: 'uint16', numpy: '<u2', values: [65535, 1, 0], shape: [3] },
    { dtype: 'int8', numpy: '<i1', values: [-128, 127, 0], shape: [3] },
    { dtype: 'uint8', numpy: '<u1', values: [0, 255, 7], shape: [1, 3] },
  ];

  it.runIf(python.available).each(cases)('decodes NumPy $numpy bytes into a $dtype array element for element', ({ dtype, numpy, values, shape }) => {
    const reference = runReferencePython<{ base64: string; values: number[] }>(
      `import sys, json, base64, numpy as np
spec = json.load(sys.stdin)
a = np.array(spec["values"], dtype=np.dtype(spec["numpy"])).reshape(spec["shape"])
print(json.dumps({"base64": base64.b64encode(np.ascontiguousarray(a).tobytes()).decode("ascii"), "values": a.ravel(order="C").tolist()}))`,
      { values, numpy, shape },
    );
    const decoded = decodeArray({ name: 'tetherNodePositionM', dtype, shape, unit: 'm', base64: reference.base64 });
    expect(decoded.length).toBe(reference.values.length);
    expect(Array.from(decoded)).toEqual(reference.values);
  });

  it('refuses bytes that do not match the shape, naming the array', () => {
    expect(() => decodeArray({ name: 'finStrain', dtype: 'float64', shape: [2, 2], unit: '1', base64: Buffer.alloc(24).toString('base64') })).toThrow(
      'Array "finStrain" should hold 4 float64 values (32 bytes) for shape [2, 2], but carries 24 bytes.',
    );
  });
});
