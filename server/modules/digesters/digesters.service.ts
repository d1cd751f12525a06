import * as repo from "./digesters.repository";

export function publicDigesters() {
  return repo.listPublicDigesters();
}
