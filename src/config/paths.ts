/** Route builders: the one place URLs of the client are spelled. */
export const paths = {
  home: () => "/",
  map: () => "/map",
  plan: () => "/plan",
} as const;
