/**
 * The digester computation of Hearthloop (DOMAIN.md): pure functions with
 * units in their names; import from here.
 */
export * from "./scraps";
export * from "./temperature";
export * from "./sizing";
export * from "./stability";
export * from "./feed-budget";
export * from "./gas";
export * from "./digestate";
export * from "./calculators";
export * from "./drop-offs";
export * from "./weekly-room";
export * from "./geo";
export * from "./assignment";
export * from "./rounds";
export * from "./safety";
export * from "./impact";
export * from "./room";
export * from "./calendar";
