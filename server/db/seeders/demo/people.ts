/**
 * People and households: the demo sign-ins, the invented residents and their homes along
 * Larkmoor's streets, couples, the households waiting for a digester, and the volunteers
 * with cargo bikes.
 */
import { DIGESTER_SPECS } from "./digesters";
import { dist, distToPath, insidePolygon, pathLength, pointAlong, type Xy } from "./geometry";
import { DIGESTER_KEYS, PERSON_KEYS } from "./keys";
import { at } from "./numbers";
import { BECK_M, HALF_HEIGHT_M, HALF_WIDTH_M, PARKS_M, STREETS_M, toLngLat } from "./place";
import { demoRandom } from "./random";
import type { DemoHousehold, DemoPerson, DemoRole } from "./types";

/** The four demo sign-ins, plus the second steward. */
export const DEMO_SIGN_IN_EMAILS = {
  resident: "resident@example.org",
  steward: "steward@example.org",
  coordinator: "coordinator@example.org",
  gardener: "gardener@example.org",
  steward2: "steward2@example.org",
} as const;

// prettier-ignore
const FIRST_NAMES = [
  "Aisha", "Bram", "Carys", "Dmitri", "Elif", "Femi", "Greta", "Hamid", "Ines", "Jonah",
  "Kezia", "Luca", "Maya", "Niall", "Oona", "Pavel", "Qamar", "Ruth", "Sami", "Tess",
  "Umar", "Vera", "Wen", "Xavier", "Yara", "Zeke", "Alma", "Ben", "Cleo", "Dev",
  "Esme", "Finn", "Gwen", "Hugo", "Isla", "Jude", "Kofi", "Lena", "Milo", "Nell",
  "Otis", "Pia", "Rafe", "Sian", "Theo", "Una", "Vikram", "Wilf", "Zofia", "Ada",
] as const;

// Household surnames; the first three belong to the demo resident, steward and second steward.
// prettier-ignore
const SURNAMES = [
  "Fennimore", "Marlowe", "Halloway", "Appleyard", "Birchall", "Coldwell", "Dimmock", "Eastoe", "Farrant", "Gilmour",
  "Hesketh", "Ibbotson", "Jessop", "Kilbride", "Lambourne", "Mossop", "Nettleship", "Okafor", "Pilling", "Quarmby",
  "Rudd", "Scarisbrick", "Thwaite", "Underhill", "Varley", "Wragg", "Nowak", "Ackroyd", "Bellamy", "Crabtree",
  "Dewhurst", "Entwistle", "Fothergill", "Haddad", "Sato", "Demir", "Lindqvist", "Moreau", "Ferreira", "Kaur",
  "Mensah", "Tattersall", "Whitworth", "Ormerod", "Lumb", "Midgley",
] as const;

const PARTNER_SURNAMES = ["Adeyemi", "Brennan", "Castillo", "Duffy", "Eriksen", "Gallo", "Hughes"] as const;

const HOUSEHOLD_COUNT = SURNAMES.length;
const TWO_MEMBER_HOUSEHOLDS = 7;
const UNASSIGNED_HOUSEHOLDS = 3;

interface Site {
  at: Xy;
  street: string;
  addressText: string;
  nearestDigesterKey: string;
}

function placeHouseholdSites(): Site[] {
  const rng = demoRandom("household-sites");
  const homeStreets = STREETS_M.filter((street) => !street.noHomes);
  const weightedStreets = homeStreets.map((street) => [street, pathLength(street.points)] as const);
  const usedAddresses = new Set<string>();
  const sites: Site[] = [];
  for (let attempt = 0; sites.length < HOUSEHOLD_COUNT; attempt++) {
    if (attempt > 20_000) throw new Error("demo data: could not place the households");
    const street = rng.weighted(weightedStreets);
    const length = pathLength(street.points);
    const s = rng.range(18, length - 18);
    const side = rng.chance(0.5) ? 1 : -1;
    const { point, dir } = pointAlong(street.points, s);
    // Left of the direction of travel is (−dy, dx).
    const offset = rng.range(14, 18) * side;
    const at: Xy = [point[0] - dir[1] * offset, point[1] + dir[0] * offset];
    const inside = Math.abs(at[0]) <= HALF_WIDTH_M - 12 && Math.abs(at[1]) <= HALF_HEIGHT_M - 12;
    if (!inside) continue;
    if (PARKS_M.some((park) => insidePolygon(at, park.points))) continue;
    if (STREETS_M.some((other) => distToPath(at, other.points) < 11)) continue;
    if (distToPath(at, BECK_M.points) < 25) continue;
    if (sites.some((site) => dist(site.at, at) < 18)) continue;
    let houseNumber = 2 * Math.max(1, Math.round(s / 12)) - (side > 0 ? 1 : 0);
    while (usedAddresses.has(`${houseNumber} ${street.name}`)) houseNumber += 2;
    const addressText = `${houseNumber} ${street.name}`;
    usedAddresses.add(addressText);
    const nearest = [...DIGESTER_SPECS].sort((a, b) => dist(a.at, at) - dist(b.at, at))[0];
    if (!nearest) throw new Error("demo data: no digesters");
    sites.push({ at, street: street.name, addressText, nearestDigesterKey: nearest.key });
  }
  return sites;
}

const emailFor = (first: string, last: string): string =>
  `${first}.${last}@larkmoor.example`.toLowerCase().replace(/[^a-z.@-]/g, "");

export interface Community {
  people: DemoPerson[];
  households: DemoHousehold[];
}

/** Everyone in Larkmoor and their households, the same whatever the day. */
export function buildCommunity(): Community {
  const rng = demoRandom("community");
  const sites = placeHouseholdSites();

  // The demo sign-ins live next to the digesters they use, so their screens have something to show.
  const takeSite = (digesterKey: string): Site => {
    const index = sites.findIndex((site) => site.nearestDigesterKey === digesterKey);
    if (index < 0) throw new Error(`demo data: no household near ${digesterKey}`);
    return at(sites.splice(index, 1), 0);
  };
  const ordered: Site[] = [
    takeSite(DIGESTER_KEYS.green),
    takeSite(DIGESTER_KEYS.orchard),
    takeSite(DIGESTER_KEYS.meadow),
    ...sites,
  ];

  const people: DemoPerson[] = [];
  const households: DemoHousehold[] = [];
  const person = (
    key: string,
    email: string,
    name: string,
    roles: DemoRole[],
    householdKey: string | null,
  ): DemoPerson => ({
    key,
    email,
    name,
    roles,
    householdKey,
    isVolunteer: false,
    bikeLoadKg: null,
    startLat: null,
    startLng: null,
  });

  const firstNames = [...FIRST_NAMES];
  let partnerIndex = 0;
  // Households that get a second member: the demo resident's, and six others spread through the list.
  const twoMember = new Set<number>([0, 5, 11, 17, 24, 30, 38].slice(0, TWO_MEMBER_HOUSEHOLDS));
  let residentNumber = 0;
  const nextResident = (householdKey: string, surname: string): DemoPerson => {
    const first = firstNames.shift();
    if (!first) throw new Error("demo data: ran out of first names");
    residentNumber += 1;
    return person(
      `person-${String(residentNumber).padStart(2, "0")}`,
      emailFor(first, surname),
      `${first} ${surname}`,
      ["resident"],
      householdKey,
    );
  };

  ordered.forEach((site, index) => {
    const key = `household-${String(index + 1).padStart(2, "0")}`;
    const surname = at(SURNAMES, index);
    const members: DemoPerson[] = [];
    if (index === 0)
      members.push(person(PERSON_KEYS.resident, DEMO_SIGN_IN_EMAILS.resident, "Rosa Fennimore", ["resident"], key));
    else if (index === 1)
      members.push(
        person(PERSON_KEYS.steward, DEMO_SIGN_IN_EMAILS.steward, "Idris Marlowe", ["steward", "resident"], key),
      );
    else if (index === 2)
      members.push(
        person(PERSON_KEYS.steward2, DEMO_SIGN_IN_EMAILS.steward2, "Priya Halloway", ["steward", "resident"], key),
      );
    else members.push(nextResident(key, surname));
    if (twoMember.has(index)) {
      // About half of the couples share a surname.
      const partnerSurname = rng.chance(0.5) ? surname : at(PARTNER_SURNAMES, partnerIndex++ % PARTNER_SURNAMES.length);
      members.push(nextResident(key, partnerSurname));
    }
    people.push(...members);
    const lngLat = toLngLat(site.at);
    households.push({
      key,
      name: `The ${surname} household`,
      addressText: site.addressText,
      lat: lngLat[1],
      lng: lngLat[0],
      memberKeys: members.map((member) => member.key),
      declaredWeeklyKg: rng.int(4, 16) / 2,
      // The last few signed up this week and wait for the coordinator to place them.
      assignedDigesterKey: index >= HOUSEHOLD_COUNT - UNASSIGNED_HOUSEHOLDS ? null : site.nearestDigesterKey,
      needsCollection: false,
    });
  });

  for (const index of [8, 14, 21, 27, 35]) at(households, index).needsCollection = true;

  // Volunteers with cargo bikes, starting from home; none of them needs a collection themselves.
  const volunteerHouseholds = [6, 19, 33].map((index) => at(households, index));
  volunteerHouseholds.forEach((household, i) => {
    const volunteer = people.find((candidate) => candidate.key === at(household.memberKeys, 0));
    if (!volunteer) throw new Error("demo data: volunteer missing");
    volunteer.isVolunteer = true;
    volunteer.bikeLoadKg = at([45, 60, 80], i);
    volunteer.startLat = household.lat;
    volunteer.startLng = household.lng;
  });

  people.push(
    person(PERSON_KEYS.coordinator, DEMO_SIGN_IN_EMAILS.coordinator, "Nadia Brightwater", ["coordinator"], null),
    person(PERSON_KEYS.gardener, DEMO_SIGN_IN_EMAILS.gardener, "Teodor Grainger", ["gardener"], null),
  );
  return { people, households };
}
