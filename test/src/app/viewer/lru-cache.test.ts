import { expect } from 'chai';
import { LruCache } from '../../../../src/app/viewer/lru-cache';

describe('client: LRU cache', () => {
  it('drops the oldest entry once it holds more than its capacity, and says which', () => {
    const evicted: string[] = [];
    const cache = new LruCache<string, number>(2, (k) => evicted.push(k));
    cache.set('a', 1);
    cache.set('b', 2);
    cache.set('c', 3);

    expect(cache.keys()).to.deep.equal(['b', 'c']);
    expect(evicted).to.deep.equal(['a']);
    expect(cache.size).to.equal(2);
  });

  it('keeps an entry that was just read and drops the next oldest instead', () => {
    const cache = new LruCache<string, number>(2);
    cache.set('a', 1);
    cache.set('b', 2);
    expect(cache.get('a')).to.equal(1);
    cache.set('c', 3);

    expect(cache.has('a')).to.equal(true);
    expect(cache.has('b')).to.equal(false);
  });

  it('does not reorder on a peek', () => {
    const cache = new LruCache<string, number>(2);
    cache.set('a', 1);
    cache.set('b', 2);
    expect(cache.peek('a')).to.equal(1);
    cache.set('c', 3);

    expect(cache.has('a')).to.equal(false);
  });

  it('treats writing an existing key as using it, without growing or evicting', () => {
    const evicted: string[] = [];
    const cache = new LruCache<string, number>(2, (k) => evicted.push(k));
    cache.set('a', 1);
    cache.set('b', 2);
    cache.set('a', 10);

    expect(cache.keys()).to.deep.equal(['b', 'a']);
    expect(cache.get('a')).to.equal(10);
    expect(evicted).to.deep.equal([]);
  });

  it('answers undefined for a key it does not hold, and keeps a stored undefined apart from a missing key', () => {
    const cache = new LruCache<string, number | undefined>(3);
    cache.set('u', undefined);

    expect(cache.get('x')).to.equal(undefined);
    expect(cache.has('u')).to.equal(true);
    expect(cache.has('x')).to.equal(false);
  });

  it('tells the owner about every entry on clear, so what was drawn can be freed', () => {
    const evicted: [string, number][] = [];
    const cache = new LruCache<string, number>(3, (k, v) => evicted.push([k, v]));
    cache.set('a', 1);
    cache.set('b', 2);
    cache.clear();

    expect(evicted).to.deep.equal([['a', 1], ['b', 2]]);
    expect(cache.size).to.equal(0);
  });

  it('removes one entry on delete and reports whether it was there', () => {
    const cache = new LruCache<string, number>(3);
    cache.set('a', 1);

    expect(cache.delete('a')).to.equal(true);
    expect(cache.delete('a')).to.equal(false);
    expect(cache.size).to.equal(0);
  });

  it('refuses a capacity below one', () => {
    expect(() => new LruCache(0)).to.throw(RangeError);
    expect(() => new LruCache(Number.NaN)).to.throw(RangeError);
  });
});
