import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createAudited, destroyAudited, updateAudited } from "@/lib/db/audit";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

let database: TestDatabase;
beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(async () => database.destroy());

describe("audited writes", () => {
  it("record who created what, with the new row and without the password hash", async () => {
    const user = await createAudited(database.models.User, { email: "audit@example.org", name: "Auditor", affiliation: null, reason: null, passwordHash: "secret-hash", statusNote: null }, { actorId: null });
    const events = await database.models.AuditEvent.findAll({ where: { entity: "User", entityId: String(user.id) } });
    expect(events).toHaveLength(1);
    expect(events[0].action).toBe("create");
    expect(events[0].after).toMatchObject({ email: "audit@example.org", name: "Auditor" });
    expect(JSON.stringify(events[0].after)).not.toContain("secret-hash");
  });

  it("record only the fields that changed, before and after, and nothing when nothing changed", async () => {
    const user = await createAudited(database.models.User, { email: "change@example.org", name: "Before", affiliation: "Old", reason: null, passwordHash: "h", statusNote: null }, { actorId: null });
    await updateAudited(user, { name: "After", affiliation: "Old" }, { actorId: user.id });
    await updateAudited(user, { name: "After" }, { actorId: user.id });
    const updates = await database.models.AuditEvent.findAll({ where: { entity: "User", entityId: String(user.id), action: "update" } });
    expect(updates).toHaveLength(1);
    expect(updates[0].before).toEqual({ name: "Before" });
    expect(updates[0].after).toEqual({ name: "After" });
    expect(updates[0].actorId).toBe(user.id);
  });

  it("write the event in the same transaction as the change, so a rollback leaves neither", async () => {
    const before = await database.models.AuditEvent.count();
    await expect(
      database.sequelize.transaction(async (transaction) => {
        await createAudited(database.models.User, { email: "rolled@example.org", name: "Gone", affiliation: null, reason: null, passwordHash: "h", statusNote: null }, { actorId: null, transaction });
        throw new Error("forced failure");
      }),
    ).rejects.toThrow("forced failure");
    expect(await database.models.AuditEvent.count()).toBe(before);
    expect(await database.models.User.count({ where: { email: "rolled@example.org" } })).toBe(0);
  });

  it("keep the row as it was when it is deleted", async () => {
    const user = await createAudited(database.models.User, { email: "bye@example.org", name: "Leaving", affiliation: null, reason: null, passwordHash: "h", statusNote: null }, { actorId: null });
    await destroyAudited(user, { actorId: null });
    const event = await database.models.AuditEvent.findOne({ where: { entity: "User", entityId: String(user.id), action: "delete" } });
    expect(event?.before).toMatchObject({ email: "bye@example.org" });
  });
});
