// Memos of analyses that only the rules read (a procedure's prose, its sequence and its decisions), kept per
// procedure while a check runs so that every rule shares one analysis. A site build keeps every procedure for its
// pages long after the check: it lets these memos go once the check is done (forgetRuleAnalyses), and an analysis
// asked for again afterwards is simply made again, the same.
const memos = new Set<RuleMemo<object, unknown>>();

export class RuleMemo<K extends object, V> {
  #entries = new WeakMap<K, V>();

  constructor() {
    memos.add(this as RuleMemo<object, unknown>);
  }

  get(key: K): V | undefined {
    return this.#entries.get(key);
  }

  set(key: K, value: V): void {
    this.#entries.set(key, value);
  }

  forget(): void {
    this.#entries = new WeakMap();
  }

  delete(key: object): void {
    this.#entries.delete(key as K);
  }
}

/**
 * Lets the analyses of one procedure go (its model and its facts are the keys): the check calls it once a file's own
 * rules are done, so that a large run does not hold every file's analyses until its end.
 */
export function forgetRuleAnalysesOf(...keys: Array<object | null | undefined>): void {
  for (const key of keys) if (key) for (const memo of memos) memo.delete(key);
}

/** Lets every rule analysis kept so far go (each is made again when asked for). */
export function forgetRuleAnalyses(): void {
  for (const memo of memos) memo.forget();
}
