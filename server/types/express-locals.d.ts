// res.locals carries what middleware established (auth, tenant), read through authOf/tenantOf.
// Request input never travels there: handlers take it from withBody/withQuery
// (server/middleware/validate.ts), typed by the schema. Typing these two as `never` makes a
// write or a read of them a type error.
export {};

declare global {
  namespace Express {
    interface Locals {
      body?: never;
      query?: never;
    }
  }
}
