import { describe, expect, it } from "vitest";
import { awaitsClient, isOverdue, itemStatusAfter, utcDay } from "@/lib/requests/status";
import { CreateRequestListSchema, REQUEST_ITEM_STATUSES } from "@/lib/validation/requests";

// The request statuses are our own workflow (common practice for evidence requests: asked, sent, agreed, sent back).
describe("itemStatusAfter", () => {
  it("makes an item provided when the client uploads, including after it was sent back", () => {
    expect(itemStatusAfter("requested", "client-upload", { pendingLeft: 0 })).toBe("provided");
    expect(itemStatusAfter("needs-more", "client-upload", { pendingLeft: 0 })).toBe("provided");
    expect(itemStatusAfter("provided", "client-upload", { pendingLeft: 3 })).toBe("provided");
  });

  it("refuses a client upload on an accepted item", () => {
    expect(() => itemStatusAfter("accepted", "client-upload", { pendingLeft: 0 })).toThrow(RangeError);
  });

  it("accepts from any state, and nothing later undoes an acceptance", () => {
    for (const s of REQUEST_ITEM_STATUSES)
      expect(itemStatusAfter(s, "file-accepted", { pendingLeft: 0 })).toBe("accepted");
    expect(itemStatusAfter("accepted", "file-returned", { pendingLeft: 0 })).toBe("accepted");
  });

  it("needs more after a file is sent back, unless another file still awaits the team", () => {
    expect(itemStatusAfter("provided", "file-returned", { pendingLeft: 0 })).toBe("needs-more");
    expect(itemStatusAfter("provided", "file-returned", { pendingLeft: 1 })).toBe("provided");
  });
});

describe("isOverdue", () => {
  const base = { listOpen: true, dueDate: "2026-11-30" };
  it("counts only open lists past the due date with the item awaiting the client", () => {
    expect(isOverdue({ ...base, status: "requested" }, "2026-12-01")).toBe(true);
    expect(isOverdue({ ...base, status: "needs-more" }, "2026-12-01")).toBe(true);
    expect(isOverdue({ ...base, status: "requested" }, "2026-11-30")).toBe(false); // due today is not yet overdue
    expect(isOverdue({ ...base, status: "provided" }, "2026-12-01")).toBe(false);
    expect(isOverdue({ ...base, status: "accepted" }, "2026-12-01")).toBe(false);
    expect(isOverdue({ ...base, listOpen: false, status: "requested" }, "2026-12-01")).toBe(false);
  });

  it("reads awaiting-client and the UTC day plainly", () => {
    expect(REQUEST_ITEM_STATUSES.filter(awaitsClient)).toEqual(["requested", "needs-more"]);
    expect(utcDay(new Date("2026-12-01T23:59:59.999Z"))).toBe("2026-12-01");
  });
});

describe("CreateRequestListSchema", () => {
  const ok = { title: "Receivables", contactUserId: "4", dueDate: "2026-12-15", items: "all", needs: ["invoice"] };
  it("takes all items or chosen ones, and hides book values by default", () => {
    expect(CreateRequestListSchema.parse(ok)).toMatchObject({ contactUserId: 4, showBookValues: false, items: "all" });
    expect(CreateRequestListSchema.parse({ ...ok, items: ["3", 5] }).items).toEqual([3, 5]);
  });

  it("names each bad field", () => {
    const r = CreateRequestListSchema.safeParse({ ...ok, dueDate: "2026-02-30", items: [], needs: ["other"] });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["dueDate", "items"]));
    const other = CreateRequestListSchema.safeParse({ ...ok, needs: ["other"] });
    expect(other.error!.issues.map((i) => i.path.join("."))).toEqual(["needsNote"]);
  });
});
