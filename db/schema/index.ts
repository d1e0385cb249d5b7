/** The database schema, one file per feature; `@/db/schema` is the one import path. */
export * from "../enums";
export * from "./people";
export * from "./plant";
export * from "./parts";
export * from "./recipes";
export * from "./documents";
export * from "./changes";
export * from "./evidence";
export * from "./audit";
export * from "./email";
export * from "./bath";
export * from "./change-types";
