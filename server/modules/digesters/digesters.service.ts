import type { DigesterSummary } from "../../../shared/schemas/digester";
import * as repo from "./digesters.repository";
import { loadDigestersToday, type DigesterToday } from "./digester-state.service";

export function publicDigesters() {
  return repo.listPublicDigesters();
}

export function toSummary(state: DigesterToday): DigesterSummary {
  const d = state.digester;
  const round = (v: number, places = 2) => Math.round(v * 10 ** places) / 10 ** places;
  return {
    id: d.id,
    name: d.name,
    status: d.status,
    statusReason: d.statusReason,
    location: { lat: d.lat, lng: d.lng },
    siteDescription: d.siteDescription,
    workingVolumeM3: d.workingVolumeM3,
    today: {
      date: state.today,
      budgetKgVs: round(state.budget.budgetKgVs, 3),
      budgetKgScraps: round(state.budget.budgetKgScraps, 1),
      budgetBuckets: round(state.budget.budgetBuckets, 1),
      binding: state.budget.binding,
      explanation: state.budget.explanation,
      warnings: state.budget.warnings.map((w) => ({ ...w, actions: [...w.actions] })),
      pendingKgScraps: round(state.pendingTodayKgScraps, 1),
      pendingKgVs: round(state.pendingTodayKgVs, 3),
      temperatureC: state.temperature.temperatureC,
    },
  };
}

/** Every digester with today's room (signed-in view). */
export async function listDigestersToday(now = new Date()): Promise<DigesterSummary[]> {
  return (await loadDigestersToday(null, { now })).map(toSummary);
}
