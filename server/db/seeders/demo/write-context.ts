/**
 * What each step of the demo writer gets: the built neighbourhood, its clock, the models, the
 * one transaction, and the row ids of everything the steps before it inserted.
 */
import type { Transaction } from "sequelize";
import type { DropOffQuantities } from "../../../../shared/domain/drop-offs";
import type { models } from "../../models";
import type { Clock } from "./clock";
import type { DemoNeighbourhood } from "./types";

/** Row ids by demo key, per kind of record ("digester", "household", "person", "dropOff" …). */
export class DemoIds {
  private readonly byKind = new Map<string, Map<string, number>>();

  /** Remembers the ids of `rows`, inserted in the order of `keys`. */
  remember(kind: string, keys: readonly string[], rows: readonly { id: number }[]): void {
    const ids = this.byKind.get(kind) ?? new Map<string, number>();
    keys.forEach((key, index) => {
      const row = rows[index];
      if (!row) throw new Error(`demo data: no ${kind} row for ${key}`);
      ids.set(key, row.id);
    });
    this.byKind.set(kind, ids);
  }

  /** The row id of a demo key; throws when no earlier step inserted it. */
  of(kind: string, key: string): number {
    const id = this.byKind.get(kind)?.get(key);
    if (id === undefined) throw new Error(`demo data: no ${kind} ${key} was written before`);
    return id;
  }
}

export interface DemoWriteContext {
  readonly demo: DemoNeighbourhood;
  /** The day the demo was built for, so a step can date rows of its own. */
  readonly clock: Clock;
  readonly m: ReturnType<typeof models>;
  readonly transaction: Transaction;
  /** The demo password's hash, shared by every demo person. */
  readonly passwordHash: string;
  readonly ids: DemoIds;
  /** Each digester's bucket density as the database stores it (kg/L, by row id). */
  readonly bucketKgPerLitre: Map<number, number>;
  /** Each drop-off's quantities by demo key, so its feeding takes in the same masses. */
  readonly dropOffQuantities: Map<string, DropOffQuantities>;
}

/** One step of the writer: inserts one kind of demo row, after the steps listed before it. */
export type DemoWriteStep = (context: DemoWriteContext) => Promise<void>;
