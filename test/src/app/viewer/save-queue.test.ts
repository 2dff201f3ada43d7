import { expect } from 'chai';
import type { ShapeState } from '../../../../src/app/viewer/command-stack';
import {
  enqueue,
  isRetryable,
  parseStoredQueue,
  pendingFor,
  resolveIds,
  retryDelayMs,
  storageKey,
  type NewChange,
  type PendingChange,
} from '../../../../src/app/viewer/save-queue';

const shape = (label: string): ShapeState => ({ classId: 'c1', kind: 'polygon', points: [[0, 0], [10, 0], [10, 10]], label });
const create = (key: string, label = 'a'): NewChange => ({ key, op: 'create', id: null, version: null, shape: shape(label) });
const update = (key: string, label: string, id: string | null = 'srv-1', version: number | null = 3): NewChange => ({ key, op: 'update', id, version, shape: shape(label) });
const remove = (key: string, id: string | null = 'srv-1', version: number | null = 3): NewChange => ({ key, op: 'delete', id, version, shape: null });
const run = (...changes: NewChange[]): PendingChange[] => changes.reduce<PendingChange[]>((q, c) => enqueue(q, c), []);

describe('client: save queue, folding changes to one entry per shape', () => {
  it('queues a new shape with no tries yet', () => {
    expect(run(create('k1'))).to.deep.equal([{ ...create('k1'), attempts: 0 }]);
  });

  it('keeps a shape drawn and then edited offline as one creation of the edited shape', () => {
    const q = run(create('k1', 'first'), update('k1', 'moved', null, null));

    expect(q).to.have.length(1);
    expect(q[0]!.op).to.equal('create');
    expect(q[0]!.shape?.label).to.equal('moved');
  });

  it('sends nothing for a shape drawn, moved and deleted before any answer', () => {
    expect(run(create('k1'), update('k1', 'moved', null, null), remove('k1', null, null))).to.deep.equal([]);
  });

  it('turns a created-then-deleted shape into a deletion once the server has given it an id', () => {
    const created = resolveIds(run(create('k1')), 'k1', 'srv-9', 1);
    const q = enqueue(created, remove('k1', null, null));

    expect(q).to.have.length(1);
    expect(q[0]).to.include({ op: 'delete', id: 'srv-9', version: 1, shape: null });
  });

  it('keeps only the last state of a stored shape edited twice', () => {
    const q = run(update('k1', 'one'), update('k1', 'two'));

    expect(q).to.have.length(1);
    expect(q[0]).to.include({ op: 'update', id: 'srv-1', version: 3 });
    expect(q[0]!.shape?.label).to.equal('two');
  });

  it('makes an edit followed by a deletion a deletion of the stored row', () => {
    const q = run(update('k1', 'one'), remove('k1'));

    expect(q).to.have.length(1);
    expect(q[0]).to.include({ op: 'delete', id: 'srv-1', version: 3, shape: null });
  });

  it('turns a deletion undone before it was sent into an update back to the old state', () => {
    const q = run(remove('k1'), create('k1', 'restored'));

    expect(q).to.have.length(1);
    expect(q[0]).to.include({ op: 'update', id: 'srv-1', version: 3 });
    expect(q[0]!.shape?.label).to.equal('restored');
  });

  it('keeps one deletion when a shape is deleted twice', () => {
    expect(run(remove('k1'), remove('k1'))).to.have.length(1);
  });

  it('keeps the order of shapes: a folded change stays where its shape first queued', () => {
    const q = run(create('k1'), create('k2'), create('k3'), update('k1', 'later', null, null));

    expect(q.map((c) => c.key)).to.deep.equal(['k1', 'k2', 'k3']);
  });

  it('leaves the other shapes alone when one drops out', () => {
    const q = run(create('k1'), create('k2'), remove('k1', null, null));

    expect(q.map((c) => c.key)).to.deep.equal(['k2']);
  });

  it('does not change the queue it was given', () => {
    const before = run(create('k1'));
    const copy = structuredClone(before);
    enqueue(before, update('k1', 'x', null, null));

    expect(before).to.deep.equal(copy);
  });
});

describe('client: save queue, ids and lookup', () => {
  it('fills in the server id and version of one shape only', () => {
    const q = resolveIds(run(create('k1'), create('k2')), 'k2', 'srv-2', 1);

    expect(pendingFor(q, 'k2')).to.include({ id: 'srv-2', version: 1 });
    expect(pendingFor(q, 'k1')).to.include({ id: null, version: null });
  });

  it('finds no entry for a shape with nothing waiting', () => {
    expect(pendingFor(run(create('k1')), 'k9')).to.equal(undefined);
  });
});

describe('client: save queue, retrying', () => {
  it('doubles the wait from 1 s with each failure when the spread is centred', () => {
    // Common practice, no source: exponential back-off with jitter.
    expect([1, 2, 3, 4].map((a) => retryDelayMs(a))).to.deep.equal([1000, 2000, 4000, 8000]);
  });

  it('caps the wait at a minute', () => {
    expect(retryDelayMs(30)).to.equal(60_000);
  });

  it('spreads the wait by a quarter either way', () => {
    // Hand-computed: 4 s ± 25 % is 3 s … 5 s.
    expect(retryDelayMs(3, 0)).to.equal(3000);
    expect(retryDelayMs(3, 1)).to.equal(5000);
  });

  it('retries network failures, timeouts, rate limits and server errors', () => {
    expect([0, 408, 429, 500, 502, 503].every(isRetryable)).to.equal(true);
  });

  it('does not retry a refusal that would be refused again', () => {
    expect([400, 401, 403, 404, 409, 422].some(isRetryable)).to.equal(false);
  });
});

describe('client: save queue, surviving a reload', () => {
  it('reads back a queue it stored', () => {
    const q = resolveIds(run(create('k1'), remove('k2')), 'k1', 'srv-7', 2);

    expect(parseStoredQueue(JSON.stringify(q))).to.deep.equal(q);
  });

  it('starts empty from nothing, broken JSON or something that is not a list', () => {
    expect(parseStoredQueue(null)).to.deep.equal([]);
    expect(parseStoredQueue('{not json')).to.deep.equal([]);
    expect(parseStoredQueue('{"key":"k1"}')).to.deep.equal([]);
  });

  it('drops entries that are not changes and keeps the good ones', () => {
    const good = { ...create('k1'), attempts: 1 };
    const stored = JSON.stringify([good, { key: 'k2', op: 'rename', id: null, version: null, shape: null, attempts: 0 }, { ...good, key: 'k3', shape: null }, null, 'k4']);

    expect(parseStoredQueue(stored)).to.deep.equal([good]);
  });

  it('keys the stored queue by image, so two images do not share one', () => {
    expect(storageKey('img-1')).to.not.equal(storageKey('img-2'));
    expect(storageKey('img-1')).to.include('img-1');
  });
});
