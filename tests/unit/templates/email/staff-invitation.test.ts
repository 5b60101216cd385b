import { describe, expect, it } from "vitest";
import { staffInvitation } from "@/templates/email/staff-invitation";

const base = {
  recipient: { name: "Ada Quill" },
  invitedBy: { name: "Ines Halvorsen" },
  firmName: "Marrow & Quill",
  actionUrl: "https://sondage.example/invitation/abcdefghijklmnopqrstuvwxyz",
  expiresInDays: 14,
};

describe("staff invitation", () => {
  it("gives a new person the one-time link and how long it works", () => {
    const m = staffInvitation({ ...base, reason: "new" });
    expect(m.subject).toBe("Marrow & Quill: choose your Sondage password");
    expect(m.text).toContain("https://sondage.example/invitation/abcdefghijklmnopqrstuvwxyz");
    expect(m.text.replace(/\s+/g, " ")).toContain("It works once and for 14 days.");
  });

  it("tells a person whose password was reset that the old one and their sessions have ended", () => {
    const m = staffInvitation({ ...base, reason: "reset" });
    expect(m.subject).toBe("Marrow & Quill: choose a new Sondage password");
    expect(m.text.replace(/\s+/g, " ")).toContain(
      "Your previous password no longer works and any session you had open has ended.",
    );
    expect(m.html).toContain("Choose a new password");
  });
});
