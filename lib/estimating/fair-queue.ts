/**
 * A queue that serves its lanes in turn (one item from each lane that has work, round and
 * round), so one lane's twenty items do not hold another lane's one. Lanes are the clients'
 * firms in the estimate pool. Order within a lane is first come, first served.
 */
export class FairQueue<T> {
  private readonly lanes = new Map<string, T[]>();
  /** Lanes with work, in the order they will next be served. */
  private readonly turn: string[] = [];
  private size = 0;

  get length(): number {
    return this.size;
  }

  /** Items waiting in one lane. */
  countIn(lane: string): number {
    return this.lanes.get(lane)?.length ?? 0;
  }

  push(lane: string, item: T): void {
    const items = this.lanes.get(lane);
    if (items) items.push(item);
    else {
      this.lanes.set(lane, [item]);
      this.turn.push(lane);
    }
    this.size += 1;
  }

  /** The next item: the head of the lane whose turn it is; that lane then goes to the back. */
  shift(): T | undefined {
    const lane = this.turn.shift();
    if (lane === undefined) return undefined;
    const items = this.lanes.get(lane)!;
    const item = items.shift()!;
    if (items.length > 0) this.turn.push(lane);
    else this.lanes.delete(lane);
    this.size -= 1;
    return item;
  }

  /** Take every item out (closing). */
  drain(): T[] {
    const out: T[] = [];
    for (let item = this.shift(); item !== undefined; item = this.shift()) out.push(item);
    return out;
  }

  /**
   * Every waiting item in the order it will be served, if nothing else arrives: the lanes'
   * heads in turn, then their second items in the same turn, and so on.
   */
  order(): T[] {
    const lanes = this.turn.map((l) => this.lanes.get(l)!);
    const out: T[] = [];
    for (let round = 0; out.length < this.size; round++) for (const items of lanes) if (round < items.length) out.push(items[round]!);
    return out;
  }
}
