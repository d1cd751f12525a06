/**
 * A collection-rounds scene far from everyone else's rows: a warm 10 m³ digester with room, three
 * households 111 m apart with a signed-in resident each, a volunteer with a 40 kg cargo bike
 * starting at the spot, and a coordinator. `forDate` is a random day 1–55 days ahead unless given.
 */
import type { Express } from "express";
import { addDays, localDate } from "../../server/lib/clock";
import { createDigester, createHousehold, signedInClient, sql } from "./db";

function remoteSpot() {
  return { lat: -30 - Math.random() * 20, lng: 100 + Math.random() * 40 };
}

/** A day of our own (other tests are unlikely to ask for collections on it). */
const someDay = () => addDays(localDate(new Date()), 1 + Math.floor(Math.random() * 55));

export async function roundsScene(app: Express, forDate = someDay()) {
  const spot = remoteSpot();
  // A warm 10 m³ digester takes well over 30 kg of scraps a day (organic limit 1.5 kg VS/m³/d at 30 °C, DOMAIN.md §2 [read]).
  const digester = await createDigester({ lat: spot.lat + 0.005, lng: spot.lng, workingVolumeM3: 10 });
  await sql(
    `INSERT INTO readings (digester_id, taken_at, temperature_c, ph) VALUES ($1, now() - interval '1 hour', 30, 7.1)`,
    [digester.id],
  );
  // A week of 10 kg VS a day, so the week-on-week limit (1.2 × last week's mean) leaves room for 30 kg of scraps.
  for (let day = 1; day <= 7; day++) {
    await sql(`INSERT INTO feedings (digester_id, fed_on, fresh_kg, kg_vs) VALUES ($1, $2, 44, 10)`, [
      digester.id,
      addDays(localDate(new Date()), -day),
    ]);
  }
  const residents = [];
  // Three households 0.001° apart going north (≈ 111 m each [derived, shared/domain/geo.ts]).
  for (let i = 0; i < 3; i++) {
    const h = await createHousehold({ lat: spot.lat + 0.001 * (i + 1), lng: spot.lng });
    await sql(`UPDATE households SET address_text = $2 WHERE id = $1`, [h.id, `${i + 1} Sorrel Lane`]);
    residents.push({ household: h, client: await signedInClient(app, { roles: ["resident"], householdId: h.id }) });
  }
  const volunteer = await signedInClient(app, { roles: ["resident"] });
  await sql(`UPDATE people SET is_volunteer = true, bike_load_kg = 40, start_lat = $2, start_lng = $3 WHERE id = $1`, [
    volunteer.person.id,
    spot.lat,
    spot.lng,
  ]);
  const coordinator = await signedInClient(app, { roles: ["coordinator"] });
  return { spot, forDate, digester, residents, volunteer, coordinator };
}
