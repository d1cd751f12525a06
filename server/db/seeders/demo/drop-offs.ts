/**
 * Drop-offs: the log that numbers every bucket the demo makes up and picks who brought it,
 * the buckets stewards turned away, and today's buckets still waiting for a steward.
 * The fed ones are made up day by day in `feedings.ts`.
 */
import type { SeededRandom } from "../../../../shared/random";
import type { Clock } from "./clock";
import { DIGESTER_KEYS } from "./keys";
import { demoRandom } from "./random";
import type { DemoDropOff, DemoHousehold, DemoScrapMix, DemoTurnedAwayReason } from "./types";

const DROP_OFF_NOTES = [
  "Peelings from batch cooking.",
  "Chopped small, as asked.",
  "Mostly veg trimmings from the allotment.",
  "Left by the inlet; lid on.",
  "Includes the week's coffee grounds.",
] as const;

/** What a made-up drop-off needs; the log adds its key, who brought it, its date and maybe a note. */
export type DropOffFields = Omit<DemoDropOff, "key" | "personKey" | "forDate" | "createdAt" | "note"> & {
  createdAt: Date;
  day: number;
  note?: string | null;
};

/** Every drop-off of the demo, numbered in the order it is made up. */
export class DropOffLog {
  readonly dropOffs: DemoDropOff[] = [];
  private dropOffNumber = 0;
  private readonly membersOf: Map<string, string[]>;
  private readonly assigned: DemoHousehold[];

  constructor(
    private readonly clock: Clock,
    households: readonly DemoHousehold[],
  ) {
    this.membersOf = new Map(households.map((household) => [household.key, household.memberKeys]));
    this.assigned = households.filter((household) => household.assignedDigesterKey !== null);
  }

  /** Households weighted by how likely they bring a bucket to `digesterKey`. */
  poolFor(digesterKey: string): readonly (readonly [string, number])[] {
    // Residents mostly use their own digester; the big Green one also takes everyone's surplus.
    if (digesterKey === DIGESTER_KEYS.green) {
      return this.assigned.map(
        (household) => [household.key, household.assignedDigesterKey === digesterKey ? 3 : 1] as const,
      );
    }
    const own = this.assigned.filter((household) => household.assignedDigesterKey === digesterKey);
    return (own.length > 0 ? own : this.assigned).map((household) => [household.key, 1] as const);
  }

  /** Adds one drop-off, brought by a member of its household picked with `rng`. */
  add(rng: SeededRandom, fields: DropOffFields): DemoDropOff {
    this.dropOffNumber += 1;
    const members = this.membersOf.get(fields.householdKey) ?? [];
    const { day, createdAt, note, ...rest } = fields;
    const dropOff: DemoDropOff = {
      key: `drop-off-${String(this.dropOffNumber).padStart(4, "0")}`,
      ...rest,
      personKey: rng.pick(members),
      createdAt: createdAt.toISOString(),
      forDate: this.clock.date(day),
      note: note ?? (rng.chance(0.06) ? rng.pick(DROP_OFF_NOTES) : null),
    };
    this.dropOffs.push(dropOff);
    return dropOff;
  }
}

interface TurnedAwayPlan {
  day: number;
  digesterKey: string;
  reason: DemoTurnedAwayReason;
  bucketLitres: number;
  mix: DemoScrapMix;
  citrusPercent: number;
  note: string;
}

const TURNED_AWAY: readonly TurnedAwayPlan[] = [
  {
    day: -52,
    digesterKey: DIGESTER_KEYS.green,
    reason: "contamination",
    bucketLitres: 10,
    mix: "cooked",
    citrusPercent: 0,
    note: "Chicken bones and a plastic bag in the bucket.",
  },
  {
    day: -47,
    digesterKey: DIGESTER_KEYS.green,
    reason: "too_much_citrus",
    bucketLitres: 15,
    mix: "fruitVeg",
    citrusPercent: 15,
    note: "Mostly orange peel from marmalade making.",
  },
  {
    day: -39,
    digesterKey: DIGESTER_KEYS.orchard,
    reason: "over_budget",
    bucketLitres: 5,
    mix: "mixed",
    citrusPercent: 2,
    note: "Digester resting after acid build-up; please take it to Larkmoor Green.",
  },
  {
    day: -37,
    digesterKey: DIGESTER_KEYS.orchard,
    reason: "over_budget",
    bucketLitres: 10,
    mix: "mixed",
    citrusPercent: 0,
    note: "Still resting; redirected to Larkmoor Green.",
  },
  {
    day: -26,
    digesterKey: DIGESTER_KEYS.school,
    reason: "over_budget",
    bucketLitres: 5,
    mix: "fruitVeg",
    citrusPercent: 5,
    note: "Too cold to digest this week.",
  },
  {
    day: -18,
    digesterKey: DIGESTER_KEYS.green,
    reason: "contamination",
    bucketLitres: 10,
    mix: "mixed",
    citrusPercent: 3,
    note: "'Compostable' bag inside; please empty it loose.",
  },
  {
    day: -6,
    digesterKey: DIGESTER_KEYS.meadow,
    reason: "too_much_citrus",
    bucketLitres: 10,
    mix: "fruitVeg",
    citrusPercent: 15,
    note: "Half lemon and lime peel; a new digester cannot take that.",
  },
];

/** Today's pending drop-offs: [digester, hour, minute, litres, weighed kg or null, mix]. */
// prettier-ignore
const PENDING_TODAY: readonly (readonly [string, number, number, number, number | null, DemoScrapMix])[] = [
  [DIGESTER_KEYS.green, 7, 40, 10, null, "mixed"],
  [DIGESTER_KEYS.green, 8, 25, 15, null, "fruitVeg"],
  [DIGESTER_KEYS.orchard, 9, 5, 5, 1.6, "fruitVeg"],
  [DIGESTER_KEYS.meadow, 9, 50, 5, null, "mixed"],
  [DIGESTER_KEYS.school, 10, 35, 5, 1.1, "fruitVeg"],
  [DIGESTER_KEYS.green, 11, 20, 10, null, "coffee"],
];

/** Adds the drop-offs stewards turned away over the history. */
export function addTurnedAway(log: DropOffLog, clock: Clock): void {
  const turnedAwayRng = demoRandom("turned-away");
  for (const plan of TURNED_AWAY) {
    log.add(turnedAwayRng, {
      householdKey: turnedAwayRng.weighted(log.poolFor(plan.digesterKey)),
      digesterKey: plan.digesterKey,
      day: plan.day,
      createdAt: clock.at(plan.day, turnedAwayRng.int(8, 18), turnedAwayRng.int(0, 59)),
      bucketCount: 1,
      bucketLitres: plan.bucketLitres,
      weightKg: null,
      mix: plan.mix,
      citrusPercent: plan.citrusPercent,
      status: "turned_away",
      turnedAwayReason: plan.reason,
      note: plan.note,
    });
  }
}

/** Adds today's pending drop-offs, never later than `today`; the first is the demo resident's. */
export function addPendingToday(log: DropOffLog, clock: Clock, residentHouseholdKey: string): void {
  const today = clock.today;
  const pendingRng = demoRandom("pending");
  const startOfToday = clock.at(0, 0, 0).getTime();
  PENDING_TODAY.forEach(([digesterKey, hour, minute, litres, weightKg, mix], index) => {
    const wanted = clock.at(0, hour, minute).getTime();
    // Early in the day the six are squeezed into the hours already gone.
    const createdAt =
      wanted <= today.getTime()
        ? wanted
        : startOfToday + ((today.getTime() - startOfToday) * (index + 1)) / (PENDING_TODAY.length + 1);
    log.add(pendingRng, {
      householdKey: index === 0 ? residentHouseholdKey : pendingRng.weighted(log.poolFor(digesterKey)),
      digesterKey,
      day: 0,
      createdAt: new Date(createdAt),
      bucketCount: 1,
      bucketLitres: litres,
      weightKg,
      mix,
      citrusPercent: mix === "fruitVeg" ? 6 : 0,
      status: "pending",
      turnedAwayReason: null,
      note: null,
    });
  });
}
