import { Router } from "express";
import { healthRouter } from "./modules/health/health.routes";
import { digestersRouter } from "./modules/digesters/digesters.routes";
import { authRouter } from "./modules/auth/auth.routes";
import { peopleRouter } from "./modules/people/people.routes";
import { accountRouter } from "./modules/account/account.routes";
import { outboxRouter } from "./modules/outbox/outbox.routes";
import { calcRouter } from "./modules/calc/calc.routes";
import { householdsRouter } from "./modules/households/households.routes";
import { dropOffsRouter } from "./modules/drop-offs/drop-offs.routes";
import { streetsRouter } from "./modules/streets/streets.routes";
import { stewardRouter } from "./modules/steward/steward.routes";
import { feedingsRouter } from "./modules/feedings/feedings.routes";
import { readingsRouter } from "./modules/readings/readings.routes";
import { digesterProfileRouter } from "./modules/digesters/digester-profile.routes";
import { assignmentsRouter } from "./modules/assignments/assignments.routes";
import { rebalancingRouter } from "./modules/rebalancing/rebalancing.routes";
import { collectionsRouter } from "./modules/collections/collections.routes";
import { roundsRouter } from "./modules/rounds/rounds.routes";

/** Every API router, mounted under /api. */
export function apiRouter() {
  const router = Router();
  router.use(healthRouter);
  // Public and stateless: before any router that might guard everything it sees.
  router.use(calcRouter());
  router.use(digestersRouter);
  router.use(authRouter());
  router.use(peopleRouter());
  router.use(accountRouter());
  router.use(outboxRouter());
  router.use(householdsRouter());
  router.use(dropOffsRouter());
  router.use(streetsRouter());
  router.use(stewardRouter());
  router.use(feedingsRouter());
  router.use(readingsRouter());
  router.use(digesterProfileRouter());
  router.use(assignmentsRouter());
  router.use(rebalancingRouter());
  router.use(collectionsRouter());
  router.use(roundsRouter());
  return router;
}
