import { describe, expect, it } from "vitest";
import { roleChangeQuestion, roleChangeSummary } from "./role-change";

describe("what a role change gives and takes", () => {
  it("names from → to and, in one line, what the person gains and loses", () => {
    expect(roleChangeQuestion("Ines Okafor", "crew", "office_manager")).toBe("Change Ines Okafor from Installer crew to Office manager?");
    expect(roleChangeSummary("crew", "office_manager")).toBe("Gains every deal, their own deals, editing deals, households and 12 more; loses nothing.");
    expect(roleChangeSummary("admin", "owner")).toBe("Gains nothing; loses nothing.");
    expect(roleChangeSummary("office_manager", "crew")).toMatch(/^Gains nothing; loses every deal, .+ and \d+ more\.$/);
    expect(roleChangeSummary("sales_rep", "admin")).toBe(
      "Gains every deal, Settings → People, inviting and managing people, company settings and 13 more; loses nothing.",
    );
  });
});
