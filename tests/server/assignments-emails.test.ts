import { describe, expect, it } from "vitest";
import { moveReasonWords, newDigesterEmail } from "../../server/modules/assignments/assignments.emails";

describe("the resident's words for why their household moves", () => {
  it("when the old digester is closed, then its status and the steward's reason are named", () => {
    expect(
      moveReasonWords({ code: "digesterClosed", fromName: "Oak Yard", status: "resting", statusReason: "sour" }),
    ).toBe("Oak Yard is resting for now (sour), so its households bring their scraps to other digesters.");
    expect(
      moveReasonWords({ code: "digesterClosed", fromName: "Oak Yard", status: "offline", statusReason: null }),
    ).toBe("Oak Yard is offline for now, so its households bring their scraps to other digesters.");
  });

  it("when the old digester was over its safe week, then both amounts are whole kg", () => {
    expect(
      moveReasonWords({
        code: "digesterOverFull",
        fromName: "Oak Yard",
        expectedKg: 61.6,
        safeKg: 40.2,
        toName: "Elm Corner",
      }),
    ).toBe(
      "Oak Yard was expecting about 62 kg of scraps this week but can safely digest about 40 kg, and Elm Corner has room.",
    );
  });

  it("when the new digester is closer, the household had none, or the coordinator gave a reason, then the e-mail says so", () => {
    expect(moveReasonWords({ code: "closer", toName: "Elm Corner", fromName: "Oak Yard", closerM: 1104.6 })).toBe(
      "Elm Corner is about 1105 m closer to your home than Oak Yard.",
    );
    expect(moveReasonWords({ code: "firstDigester", toName: "Elm Corner" })).toMatch(/had no digester yet/);
    expect(moveReasonWords({ code: "coordinatorReason", text: "Oak Yard is being rebuilt." })).toBe(
      "Oak Yard is being rebuilt.",
    );
    expect(moveReasonWords({ code: "rebalanced" })).toMatch(/^the coordinator re-balanced households/);
  });

  it("when the e-mail is written, then its Why line is the reason's words", () => {
    const email = newDigesterEmail({
      to: "someone@example.org",
      name: "Sam",
      householdName: "Maple House",
      digesterName: "Elm Corner",
      siteDescription: "",
      distanceM: 80,
      previousDigesterName: "Oak Yard",
      why: { code: "closer", toName: "Elm Corner", fromName: "Oak Yard", closerM: 1104.6 },
    });
    expect(email.text).toContain("Why: Elm Corner is about 1105 m closer to your home than Oak Yard.");
  });
});
