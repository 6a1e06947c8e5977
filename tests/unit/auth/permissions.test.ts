import { describe, expect, it } from "vitest";
import { can, PERMISSIONS, ROLE_PERMISSIONS, type Permission } from "@/lib/auth/permissions";
import { ROLES, type Role, type SessionUser } from "@/lib/auth/roles";

const user = (role: Role, id = `${role}-id`): SessionUser => ({ id, email: `${role}@kestrel.test`, name: role, role });

/**
 * The expected table, written out by hand from shared/PRODUCT.md ("Who uses it"): artists read,
 * subscribe, log uses, ask, request and try the lab; seniors also write; leads also review and
 * manage tags and shows; admins manage people, mail and the audit log and otherwise read.
 */
const EXPECTED: Record<Role, Permission[]> = {
  artist: ["technique:read", "use:log", "use:edit", "question:ask", "question:answer", "question:resolve", "request:create", "still:upload-trial", "still:read", "lab:run", "subscription:manage", "token:manage"],
  senior: [],
  lead: [],
  admin: [],
};
EXPECTED.senior = [...EXPECTED.artist, "technique:read-working", "technique:write", "technique:submit", "request:claim", "still:upload"];
EXPECTED.lead = [...EXPECTED.senior, "technique:review", "technique:retire", "technique:set-house-method", "tag:manage", "show:manage"];
EXPECTED.admin = [...EXPECTED.artist, "people:manage", "mail:read-outbox", "audit:read"];

const OWNERSHIP: Permission[] = ["use:edit", "question:answer", "question:resolve", "still:read"];

describe("permissions table: every role × every permission", () => {
  for (const role of ROLES) {
    for (const permission of PERMISSIONS) {
      const expected = EXPECTED[role].includes(permission);
      it(`${role} ${expected ? "may" : "may not"} ${permission}`, () => {
        expect(ROLE_PERMISSIONS[role].has(permission)).toBe(expected);
        const resource = OWNERSHIP.includes(permission) ? { ownerId: `${role}-id`, techniqueAuthorId: `${role}-id`, stillOwner: "trial" as const } : undefined;
        expect(can(user(role), permission, resource)).toBe(expected);
      });
    }
  }

  it("denies by default: nobody signed in, or an unknown role", () => {
    for (const permission of PERMISSIONS) {
      expect(can(null, permission)).toBe(false);
      expect(can({ ...user("artist"), role: "root" as Role }, permission)).toBe(false);
    }
  });
});

describe("ownership rules", () => {
  it("use logs: own, or a lead", () => {
    expect(can(user("artist", "a"), "use:edit", { ownerId: "a" })).toBe(true);
    expect(can(user("artist", "a"), "use:edit", { ownerId: "b" })).toBe(false);
    expect(can(user("senior", "s"), "use:edit", { ownerId: "b" })).toBe(false);
    expect(can(user("lead", "l"), "use:edit", { ownerId: "b" })).toBe(true);
    expect(can(user("artist", "a"), "use:edit")).toBe(false);
  });

  it("private trial stills: their uploader only, leads and admins not; technique stills: anyone who reads", () => {
    expect(can(user("artist", "a"), "still:read", { stillOwner: "trial", ownerId: "a" })).toBe(true);
    expect(can(user("artist", "a"), "still:read", { stillOwner: "trial", ownerId: "b" })).toBe(false);
    expect(can(user("senior", "s"), "still:read", { stillOwner: "trial", ownerId: "b" })).toBe(false);
    expect(can(user("lead", "l"), "still:read", { stillOwner: "trial", ownerId: "b" })).toBe(false);
    expect(can(user("admin", "d"), "still:read", { stillOwner: "trial", ownerId: "b" })).toBe(false);
    expect(can(user("lead", "l"), "still:read", { stillOwner: "trial", ownerId: "l" })).toBe(true);
    expect(can(user("artist", "a"), "still:read", { stillOwner: "technique", ownerId: "b" })).toBe(true);
  });

  it("answers: the technique's author and leads", () => {
    expect(can(user("senior", "s"), "question:answer", { techniqueAuthorId: "s" })).toBe(true);
    expect(can(user("senior", "s"), "question:answer", { techniqueAuthorId: "x" })).toBe(false);
    expect(can(user("lead", "l"), "question:answer", { techniqueAuthorId: "x" })).toBe(true);
  });
});
