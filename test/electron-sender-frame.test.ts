// The IPC sender check, after Electron's security checklist item 17 "Validate the sender of all
// IPC messages" (parse the frame URL with a real URL parser and compare against an allow list;
// item 13 warns that prefix checks let "example.com.attacker.com" through).
import { describe, expect, it } from 'vitest';

import { createIpcRequestListener, REFUSED_SENDER_REPLY } from '../electron/ipc-shell.ts';
import type { RequestHandlers } from '../electron/request-handlers.ts';
import { isTrustedSenderFrame } from '../electron/sender-frame-check.ts';
import type { RequestName, RequestReply } from '../sim/bridge/bridge-contract.ts';

const top = (url: string) => ({ url, parent: null });

describe('sender frame check (Electron checklist item 17)', () => {
  it('trusts the top frame of our own page', () => {
    expect(isTrustedSenderFrame(top('pliant://app/index.html'))).toBe(true);
    expect(isTrustedSenderFrame(top('pliant://app/index.html?view=datasets#episode-3'))).toBe(true);
  });

  it.each([
    ['a remote site', 'https://example.com/index.html'],
    ['a host that merely starts with ours', 'pliant://app.example.com/index.html'],
    ['a look-alike with user info', 'pliant://app@example.com/index.html'],
    ['user info in front of our host', 'pliant://someone@app/index.html'],
    ['another host on our scheme', 'pliant://other/index.html'],
    ['a file URL', 'file:///opt/pliant/dist/renderer/index.html'],
    ['the web-mode origin', 'http://127.0.0.1:5173/index.html'],
    ['about:blank', 'about:blank'],
    ['a data URL', 'data:text/html,<script>1</script>'],
    ['an empty URL', ''],
    ['a URL that does not parse', 'pliant:// app/index.html'],
  ])('refuses %s', (_label, url) => {
    expect(isTrustedSenderFrame(top(url))).toBe(false);
  });

  it('refuses a child frame even on our own origin, and a frame that is gone', () => {
    expect(isTrustedSenderFrame({ url: 'pliant://app/index.html', parent: top('pliant://app/index.html') })).toBe(false);
    expect(isTrustedSenderFrame(null)).toBe(false);
    expect(isTrustedSenderFrame(undefined)).toBe(false);
  });
});

describe('IPC request listener', () => {
  function recordingHandlers(): { handlers: RequestHandlers; calls: unknown[][] } {
    const calls: unknown[][] = [];
    const handlers: RequestHandlers = {
      handle: async (name, args) => {
        calls.push([name, args]);
        return { ok: true, result: { name: 'Pliant' } } as unknown as RequestReply<RequestName>;
      },
      onEvent: () => () => undefined,
    };
    return { handlers, calls };
  }

  it('never passes a foreign sender\'s request to the registry, and says why', async () => {
    const { handlers, calls } = recordingHandlers();
    const refused: string[] = [];
    const listener = createIpcRequestListener(handlers, (url) => refused.push(url));
    const reply = await listener({ senderFrame: top('https://example.com/') }, 'scenario.read', { path: '/etc/passwd' });
    expect(reply).toEqual(REFUSED_SENDER_REPLY);
    expect(reply).toMatchObject({ ok: false, error: { code: 'refused-sender' } });
    expect(calls).toEqual([]);
    expect(refused).toEqual(['https://example.com/']);
    expect(await listener({ senderFrame: null }, 'app.info', {})).toEqual(REFUSED_SENDER_REPLY);
    expect(refused).toEqual(['https://example.com/', '(frame gone)']);
  });

  it('passes our own page\'s request through unchanged', async () => {
    const { handlers, calls } = recordingHandlers();
    const listener = createIpcRequestListener(handlers);
    const reply = await listener({ senderFrame: top('pliant://app/index.html') }, 'app.info', {});
    expect(reply).toEqual({ ok: true, result: { name: 'Pliant' } });
    expect(calls).toEqual([['app.info', {}]]);
  });
});
