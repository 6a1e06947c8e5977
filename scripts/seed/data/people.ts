/*
 * Demo people at Kestrel Yard, an invented facility. The first four are the sign-in accounts
 * the README lists (one per role); the rest make the department look lived in. All invented.
 */

type DemoRole = "artist" | "senior" | "lead" | "admin";
type DemoPerson = { email: string; name: string; role: DemoRole };

/** Shared by every demo account; printed by `npm run demo`. Never a production password. */
export const DEMO_PASSWORD = "plateroom-demo";

export const DEMO_PEOPLE: readonly DemoPerson[] = [
  { email: "artist@kestrel.test", name: "Tamsin Orrey", role: "artist" },
  { email: "senior@kestrel.test", name: "Joel Brackwell", role: "senior" },
  { email: "lead@kestrel.test", name: "Ines Varrow", role: "lead" },
  { email: "admin@kestrel.test", name: "Rob Tillard", role: "admin" },
  { email: "kofi.ashdown@kestrel.test", name: "Kofi Ashdown", role: "senior" },
  { email: "wen.halloway@kestrel.test", name: "Wen Halloway", role: "senior" },
  { email: "lena.strandberg@kestrel.test", name: "Lena Strandberg", role: "artist" },
  { email: "dara.pellow@kestrel.test", name: "Dara Pellow", role: "artist" },
  { email: "maud.okonjo@kestrel.test", name: "Maud Okonjo-Reeve", role: "lead" },
];
