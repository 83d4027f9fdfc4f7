/**
 * Words written on first read.
 *
 * The rules work out every figure eagerly, but writing the sentences that explain them
 * (number formatting, long templates) costs far more than the arithmetic. So a list of
 * reasons, or the message of a warning, is handed out as a stand-in that writes its words
 * the first time anything reads them, and from then on is just the words.
 *
 * A stand-in behaves like the plain array or object it stands for: indexing, `length`,
 * iteration, array methods, `Object.keys`, spread, `JSON.stringify` and deep equality all
 * see the written words, with the keys in the same order. (It is a Proxy over the real
 * array or object; the words are written into that target, once.)
 */

/** An array whose items are written by `write` on first use of the array. */
export function deferredList<T>(write: (into: T[]) => void): T[] {
  return new Proxy<T[]>([], new WriteOnce<T>(write));
}

/**
 * An array whose items `writer.write` puts in on first use of the array. A writer that
 * holds its own figures costs less than a closure over them when there are thousands.
 */
export function deferredListOf<T>(writer: DeferredList<T>): T[] {
  return new Proxy<T[]>([], writer);
}

/**
 * `record` with the text field `key` written by `write` on first read of that field.
 * `record` should already hold `key` (say as '') so that the keys keep their order.
 * Reading any other field does not write the text.
 */
export function deferredField<T extends object, K extends keyof T>(record: T, key: K, write: () => T[K]): T {
  return new Proxy<T>(record, new DeferredField<T, K>(key, write));
}

/** Writes a deferred list's items; extend it with the figures the words need. */
export abstract class DeferredList<T> implements ProxyHandler<T[]> {
  private written = false;

  /** Put the items into `into` (called once, on first use). */
  protected abstract write(into: T[]): void;

  private ready(target: T[]): void {
    if (!this.written) {
      this.written = true;
      this.write(target);
    }
  }

  get(target: T[], key: string | symbol, receiver: unknown): unknown {
    this.ready(target);
    return Reflect.get(target, key, receiver);
  }
  has(target: T[], key: string | symbol): boolean {
    this.ready(target);
    return Reflect.has(target, key);
  }
  ownKeys(target: T[]): ArrayLike<string | symbol> {
    this.ready(target);
    return Reflect.ownKeys(target);
  }
  getOwnPropertyDescriptor(target: T[], key: string | symbol): PropertyDescriptor | undefined {
    this.ready(target);
    return Reflect.getOwnPropertyDescriptor(target, key);
  }
  set(target: T[], key: string | symbol, value: unknown, receiver: unknown): boolean {
    this.ready(target);
    return Reflect.set(target, key, value, receiver);
  }
  defineProperty(target: T[], key: string | symbol, descriptor: PropertyDescriptor): boolean {
    this.ready(target);
    return Reflect.defineProperty(target, key, descriptor);
  }
  deleteProperty(target: T[], key: string | symbol): boolean {
    this.ready(target);
    return Reflect.deleteProperty(target, key);
  }
  preventExtensions(target: T[]): boolean {
    // Freezing or sealing the list first writes its items.
    this.ready(target);
    return Reflect.preventExtensions(target);
  }
}

class WriteOnce<T> extends DeferredList<T> {
  constructor(private readonly writeItems: (into: T[]) => void) {
    super();
  }
  protected write(into: T[]): void {
    this.writeItems(into);
  }
}

class DeferredField<T extends object, K extends keyof T> implements ProxyHandler<T> {
  private write: (() => T[K]) | null;
  private readonly key: K;

  constructor(key: K, write: () => T[K]) {
    this.key = key;
    this.write = write;
  }

  private ready(target: T, key: string | symbol): void {
    const write = this.write;
    if (write !== null && key === this.key) {
      this.write = null;
      target[this.key] = write();
    }
  }

  get(target: T, key: string | symbol, receiver: unknown): unknown {
    this.ready(target, key);
    return Reflect.get(target, key, receiver);
  }
  getOwnPropertyDescriptor(target: T, key: string | symbol): PropertyDescriptor | undefined {
    this.ready(target, key);
    return Reflect.getOwnPropertyDescriptor(target, key);
  }
  set(target: T, key: string | symbol, value: unknown, receiver: unknown): boolean {
    // Written over before it was read: the deferred words are no longer wanted.
    if (key === this.key) this.write = null;
    return Reflect.set(target, key, value, receiver);
  }
  defineProperty(target: T, key: string | symbol, descriptor: PropertyDescriptor): boolean {
    if (key === this.key) this.write = null;
    return Reflect.defineProperty(target, key, descriptor);
  }
  deleteProperty(target: T, key: string | symbol): boolean {
    if (key === this.key) this.write = null;
    return Reflect.deleteProperty(target, key);
  }
  preventExtensions(target: T): boolean {
    // Freezing or sealing the record first writes its text.
    this.ready(target, this.key as string | symbol);
    return Reflect.preventExtensions(target);
  }
}
