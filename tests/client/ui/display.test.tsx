import { describe, expect, it } from "vitest";
import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { Progress } from "@/components/ui/progress";
import { Stat } from "@/components/ui/stat";
import { PageHeader } from "@/components/ui/page-header";
import { Spinner } from "@/components/ui/spinner";
import { Tabs } from "@/components/ui/tabs";
import { CardTitle } from "@/components/ui/card";

describe("Progress", () => {
  it("when given a value, then the bar is labelled and the percentage is written out", () => {
    render(<Progress label="Today's feed budget used" value={3} max={8} />);
    const bar = screen.getByRole("progressbar", { name: "Today's feed budget used" });
    expect(bar).toHaveAttribute("value", "3");
    // 3 / 8 = 37.5 % → rounded to 38 %.
    expect(screen.getByText("38%")).toBeInTheDocument();
  });

  it("when the value exceeds max, then it is clamped to 100%", () => {
    render(<Progress label="Gas holder" value={12} max={10} />);
    expect(screen.getByText("100%")).toBeInTheDocument();
  });
});

describe("Stat", () => {
  it("when rendered, then the label is paired with the value and its unit", () => {
    render(<Stat label="Scraps diverted" value="412" unit="kg" hint="Since March" />);
    expect(screen.getByRole("term")).toHaveTextContent("Scraps diverted");
    const [value, hint] = screen.getAllByRole("definition");
    expect(value).toHaveTextContent("412kg");
    expect(hint).toHaveTextContent("Since March");
  });
});

describe("headings", () => {
  it("when PageHeader renders, then its title is the h1", () => {
    render(<PageHeader title="Digesters" description="All digesters in the network" />);
    expect(screen.getByRole("heading", { level: 1, name: "Digesters" })).toBeInTheDocument();
  });

  it("when CardTitle gets a level, then it renders that heading level", () => {
    render(<CardTitle level={3}>Hollow Lane tank</CardTitle>);
    expect(screen.getByRole("heading", { level: 3, name: "Hollow Lane tank" })).toBeInTheDocument();
  });
});

describe("Spinner", () => {
  it("when labelled, then it is a status with that name; without a label it is hidden", () => {
    const { container } = render(
      <>
        <Spinner label="Loading readings" />
        <Spinner />
      </>,
    );
    expect(screen.getByRole("status")).toHaveTextContent("Loading readings");
    expect(container.querySelectorAll("svg[aria-hidden='true']")).toHaveLength(2);
  });
});

describe("Tabs", () => {
  it("when arrow keys are used, then selection and focus move and only the selected panel shows", async () => {
    const user = userEvent.setup();
    render(
      <Tabs
        label="Digester views"
        items={[
          { value: "budget", label: "Budget", content: <p>Budget panel</p> },
          { value: "readings", label: "Readings", content: <p>Readings panel</p> },
          { value: "gas", label: "Gas", content: <p>Gas panel</p> },
        ]}
      />,
    );
    const budget = screen.getByRole("tab", { name: "Budget" });
    expect(budget).toHaveAttribute("aria-selected", "true");
    expect(screen.getByRole("tabpanel", { name: "Budget" })).toHaveTextContent("Budget panel");
    await user.tab();
    expect(budget).toHaveFocus();
    await user.keyboard("{ArrowLeft}");
    const gas = screen.getByRole("tab", { name: "Gas" });
    expect(gas).toHaveFocus();
    expect(gas).toHaveAttribute("aria-selected", "true");
    expect(screen.getByRole("tabpanel", { name: "Gas" })).toHaveTextContent("Gas panel");
    expect(screen.getByText("Budget panel")).not.toBeVisible();
  });
});
