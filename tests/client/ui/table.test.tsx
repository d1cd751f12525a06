import { describe, expect, it, vi } from "vitest";
import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { Table, TBody, TD, TH, THead, TR } from "@/components/ui/table";

describe("Table", () => {
  it("when rendered, then its scroll region is labelled and reachable by Tab", async () => {
    render(
      <Table label="Drop-offs this week">
        <THead>
          <TR>
            <TH>Household</TH>
          </TR>
        </THead>
        <TBody>
          <TR>
            <TD>Number 4, Quarry Row</TD>
          </TR>
        </TBody>
      </Table>,
    );
    const region = screen.getByRole("region", { name: "Drop-offs this week" });
    expect(region).toHaveAttribute("tabindex", "0");
    expect(region).toHaveClass("overflow-x-auto");
    await userEvent.tab();
    expect(region).toHaveFocus();
    expect(screen.getByRole("table")).toBeInTheDocument();
    expect(screen.getByRole("columnheader", { name: "Household" })).toHaveAttribute("scope", "col");
  });

  it("when a column is sortable, then aria-sort reflects the order and its header button asks for a new sort", async () => {
    const onSort = vi.fn();
    render(
      <Table label="Readings">
        <THead>
          <TR>
            <TH sort="descending" onSort={onSort}>
              Temperature °C
            </TH>
            <TH>Note</TH>
          </TR>
        </THead>
      </Table>,
    );
    const header = screen.getByRole("columnheader", { name: "Temperature °C" });
    expect(header).toHaveAttribute("aria-sort", "descending");
    expect(screen.getByRole("columnheader", { name: "Note" })).not.toHaveAttribute("aria-sort");
    await userEvent.click(screen.getByRole("button", { name: "Temperature °C" }));
    expect(onSort).toHaveBeenCalledTimes(1);
  });
});
