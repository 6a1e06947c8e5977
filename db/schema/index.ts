export * from "./people";
export * from "./tags";
export * from "./techniques";
export * from "./stills";
export * from "./shows";
export * from "./mail";
export * from "./changes";
export * from "./plate-checks";
