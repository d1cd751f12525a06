import { describe, expect, it } from "vitest";
import { render, screen } from "@testing-library/react";
import { Alert, type AlertVariant } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Caution } from "@/components/ui/caution";

describe("Alert", () => {
  it.each<AlertVariant>(["info", "success", "warning", "danger"])(
    "when variant is %s, then it shows a text title and an icon, not colour alone",
    (variant) => {
      render(
        <Alert variant={variant} title={`Title for ${variant}`}>
          Body text
        </Alert>,
      );
      const alert = screen.getByRole("status");
      expect(alert).toHaveTextContent(`Title for ${variant}`);
      expect(alert).toHaveTextContent("Body text");
      const icon = alert.querySelector("svg");
      expect(icon).not.toBeNull();
      expect(icon).toHaveAttribute("aria-hidden", "true");
    },
  );

  it("when the variants differ, then their icons differ too", () => {
    render(
      <>
        <Alert variant="success" title="A" />
        <Alert variant="danger" title="B" />
      </>,
    );
    const [first, second] = screen.getAllByRole("status");
    expect(first?.querySelector("svg")?.getAttribute("class")).not.toBe(
      second?.querySelector("svg")?.getAttribute("class"),
    );
  });

  it("when assertive, then it is an alert; when off, it has no live role", () => {
    render(
      <>
        <Alert variant="danger" title="Could not save" announce="assertive" />
        <Alert variant="info" title="Resting until Monday" announce="off" />
      </>,
    );
    expect(screen.getByRole("alert")).toHaveTextContent("Could not save");
    expect(screen.queryByRole("status")).toBeNull();
    expect(screen.getByText("Resting until Monday")).toBeInTheDocument();
  });
});

describe("Badge", () => {
  it("when a status tone is used, then it has its words and a decorative icon", () => {
    render(<Badge tone="warning">Near budget</Badge>);
    const badge = screen.getByText("Near budget");
    expect(badge.querySelector("[aria-hidden='true'] svg")).not.toBeNull();
  });

  it("when icon is null, then no icon is drawn", () => {
    render(
      <Badge tone="danger" icon={null}>
        Offline
      </Badge>,
    );
    expect(screen.getByText("Offline").querySelector("svg")).toBeNull();
  });
});

describe("Caution", () => {
  it("when given items, then it is a note named by its heading, lists them and closes with the local-rules line", () => {
    render(<Caution items={["No flames near the digester.", "Never enter a tank alone."]} />);
    const note = screen.getByRole("note", { name: "Safety" });
    expect(screen.getByRole("heading", { name: "Safety", level: 2 })).toBeInTheDocument();
    const items = screen.getAllByRole("listitem").map((item) => item.textContent);
    expect(items).toEqual(["No flames near the digester.", "Never enter a tank alone."]);
    expect(note).toHaveTextContent(/local gas, building and waste rules/i);
  });
});
