/** Route builders: the one place URLs of the client are spelled. */
export const paths = {
  home: () => "/",
  map: () => "/map",
  plan: () => "/plan",
  /** Sign-in; `next` is the page to return to afterwards (only a path on this site is honoured). */
  signIn: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in"),
  resetPassword: () => "/reset-password",
  // Tokens are base64url, safe in a path as they are (and ":token" gives the route pattern).
  resetPasswordWithToken: (token: string) => `/reset-password/${token}`,
  invitation: (token: string) => `/invitation/${token}`,
  account: () => "/account",
  people: () => "/people",
  /** The resident's household: registration first, then its details and members. */
  household: () => "/household",
  /** Log a drop-off, optionally with a digester chosen (from the map). */
  logDropOff: (digesterId?: number) => (digesterId ? `/drop-offs/new?digester=${digesterId}` : "/drop-offs/new"),
  /** The household's drop-offs and what they became. */
  dropOffs: () => "/drop-offs",
  /** The steward's day: every digester they look after (coordinators: all). */
  stewardToday: () => "/steward",
  /** A digester's page: charts, records, profile and status (":id" gives the route pattern). */
  digester: (id: number | string) => `/digesters/${id}`,
  /** The coordinator's board: assignment proposals and today's rebalancing. */
  coordinator: () => "/coordinator",
  /** Collection rounds: coordinators plan a date; volunteers see their own. */
  collectionRounds: (date?: string) => (date ? `/rounds?date=${date}` : "/rounds"),
  /** One round's sheet, printable (":id" gives the route pattern). */
  roundSheet: (id: number | string) => `/rounds/${id}`,
} as const;
