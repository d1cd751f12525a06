/**
 * Collection requests and rounds: the module that owns `collection_requests`,
 * `collection_rounds` and `collection_round_stops`. The collections module (residents' requests)
 * and rebalancing call what is exported here, never a repository of this folder.
 */
export {
  findRequestView,
  hasLiveRequest,
  insertRequest,
  listRequestViews,
  lockRequest,
  lockRoundOfRequest,
  markCancelled,
  removeFromRounds,
  REQUEST_LIST_LIMIT,
} from "./collection-requests.repository";
export { dropOffsMadeByRounds } from "./rounds.repository";
export { refreshRound } from "./rounds.service";
