export const ROLES = ["artist", "senior", "lead", "admin"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  artist: "Artist",
  senior: "Senior",
  lead: "Lead",
  admin: "Admin",
};

/** The signed-in person as every permission check sees them. */
export type SessionUser = { id: string; email: string; name: string; role: Role };
