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
} as const;
