/**
 * Two tabs on one participant (issue 14): tabs talk over a broadcast channel (modelled here by an in-memory
 * bus with the HTML standard's BroadcastChannel semantics: a message reaches every other channel of the same
 * name, never the sender, asynchronously). The tab that opened the participant first owns the review.
 */
import { describe, expect, it } from 'vitest';
import { createStore } from 'zustand/vanilla';
import { startTabWatch } from '../../src/state/tab-watch.ts';
import type { TabClash } from '../../src/state/persistence.ts';
import type { WorkbenchState } from '../../src/state/types.ts';

type Listener = ((ev: MessageEvent) => void) | null;

function bus() {
  const members = new Set<{ onmessage: Listener }>();
  return () => {
    const ch = {
      onmessage: null as Listener,
      postMessage(m: unknown) {
        for (const other of members) if (other !== ch) queueMicrotask(() => other.onmessage?.({ data: structuredClone(m) } as MessageEvent));
      },
      close() {
        members.delete(ch);
      },
    };
    members.add(ch);
    return ch;
  };
}

const tabState = (rec: string | null) =>
  createStore<WorkbenchState>()(() => ({ recordingSha256: rec, decompositionSha256: rec ? 'd'.repeat(64) : null, evidence: rec ? [] : null }) as unknown as WorkbenchState);

const settle = () => new Promise((r) => setTimeout(r, 5));

describe('second tab on the same participant', () => {
  it('tells the later tab which tab owns the review, tells the owner, and hands over when the owner goes', async () => {
    const channel = bus();
    const a: (TabClash | null)[] = [];
    const b: (TabClash | null)[] = [];
    let tookOver = 0;
    const storeA = tabState('r'.repeat(64));
    const watchA = startTabWatch(storeA, { channel: channel(), onClash: (c) => a.push(c) });
    await new Promise((r) => setTimeout(r, 3)); // A opened it first
    const storeB = tabState('r'.repeat(64));
    const watchB = startTabWatch(storeB, { channel: channel(), onClash: (c) => b.push(c), onTakeOver: () => tookOver++ });
    await settle();
    expect(b.at(-1)).toEqual({ thisTabOwns: false, ownerLabel: watchA.label() });
    expect(a.at(-1)?.thisTabOwns).toBe(true);
    watchA.stop();
    await settle();
    expect(b.at(-1)).toBeNull();
    expect(tookOver).toBe(1);
    watchB.stop();
  });

  it('says nothing when the tabs have different participants open', async () => {
    const channel = bus();
    const a: (TabClash | null)[] = [];
    const b: (TabClash | null)[] = [];
    const watchA = startTabWatch(tabState('r'.repeat(64)), { channel: channel(), onClash: (c) => a.push(c) });
    const watchB = startTabWatch(tabState('s'.repeat(64)), { channel: channel(), onClash: (c) => b.push(c) });
    await settle();
    expect([...a, ...b].filter((c) => c !== null)).toEqual([]);
    watchA.stop();
    watchB.stop();
  });
});
