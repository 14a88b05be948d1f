/** A binary max-heap on a numeric key. */
export class MaxHeap<T> {
  private items: T[] = [];
  constructor(private readonly key: (item: T) => number) {}

  get size(): number {
    return this.items.length;
  }

  peek(): T | undefined {
    return this.items[0];
  }

  push(item: T): void {
    const a = this.items;
    a.push(item);
    let i = a.length - 1;
    const k = this.key(item);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (this.key(a[parent]) >= k) break;
      a[i] = a[parent];
      i = parent;
    }
    a[i] = item;
  }

  pop(): T | undefined {
    const a = this.items;
    if (!a.length) return undefined;
    const top = a[0];
    const last = a.pop()!;
    if (a.length) {
      let i = 0;
      const k = this.key(last);
      for (;;) {
        const l = 2 * i + 1;
        if (l >= a.length) break;
        const r = l + 1;
        const c = r < a.length && this.key(a[r]) > this.key(a[l]) ? r : l;
        if (this.key(a[c]) <= k) break;
        a[i] = a[c];
        i = c;
      }
      a[i] = last;
    }
    return top;
  }

  clear(): void {
    this.items = [];
  }
}
