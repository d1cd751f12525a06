import { describe, expect, it, vi } from "vitest";
import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import type { PersonRow } from "@shared/schemas/people";
import { PeopleTable } from "@/features/people/components/people-table";

function person(id: number, name: string, overrides: Partial<PersonRow> = {}): PersonRow {
  return {
    id,
    name,
    email: `${name.toLowerCase().replace(/\s+/g, ".")}@example.org`,
    roles: ["resident"],
    status: "active",
    householdId: null,
    householdName: null,
    stewardOf: [],
    isVolunteer: false,
    bikeLoadKg: null,
    createdAt: "2026-05-01T09:00:00.000Z",
    invitationExpiresAt: null,
    ...overrides,
  };
}

// 12 people: more than one page of 10.
const people: PersonRow[] = [
  person(1, "Wren Oakes", { roles: ["steward"], stewardOf: [7] }),
  person(2, "Alma Reed", { roles: ["coordinator"] }),
  person(3, "Milo Finch", { status: "disabled" }),
  person(4, "Tess Marsh", { status: "invited" }),
  ...Array.from({ length: 8 }, (_, i) => person(10 + i, `Resident ${String.fromCharCode(65 + i)}`)),
];

function names() {
  const rows = within(screen.getByRole("table")).getAllByRole("row").slice(1);
  return rows.map((row) => within(row).getAllByRole("cell")[0]!.textContent);
}

describe("PeopleTable", () => {
  it("when shown, then it is sorted by name, pages by 10, and says how many it shows", async () => {
    render(<PeopleTable people={people} digesterNames={new Map([[7, "Willow Yard"]])} onEdit={() => undefined} />);
    expect(names()).toHaveLength(10);
    expect(names()[0]).toBe("Alma Reed");
    expect(screen.getByText("Showing 1–10 of 12 people.")).toBeInTheDocument();
    expect(screen.getByRole("columnheader", { name: /Name/ })).toHaveAttribute("aria-sort", "ascending");
    await userEvent.click(screen.getByRole("button", { name: "Next page" }));
    expect(names()).toHaveLength(2);
    expect(screen.getByText("Page 2 of 2")).toBeInTheDocument();
  });

  it("when the name header is pressed, then the order reverses and aria-sort says so", async () => {
    render(<PeopleTable people={people} digesterNames={new Map()} onEdit={() => undefined} />);
    await userEvent.click(screen.getByRole("button", { name: /^Name/ }));
    expect(screen.getByRole("columnheader", { name: /Name/ })).toHaveAttribute("aria-sort", "descending");
    expect(names()[0]).toBe("Wren Oakes");
  });

  it("when searching, filtering by role or by status, then only matching people remain", async () => {
    render(<PeopleTable people={people} digesterNames={new Map([[7, "Willow Yard"]])} onEdit={() => undefined} />);
    await userEvent.type(screen.getByLabelText("Search by name or e-mail"), "oakes");
    expect(names()).toEqual(["Wren Oakes"]);
    expect(screen.getByRole("cell", { name: "Willow Yard" })).toBeInTheDocument();
    await userEvent.clear(screen.getByLabelText("Search by name or e-mail"));
    await userEvent.selectOptions(screen.getByLabelText("Role"), "coordinator");
    expect(names()).toEqual(["Alma Reed"]);
    await userEvent.selectOptions(screen.getByLabelText("Role"), "");
    await userEvent.selectOptions(screen.getByLabelText("Status"), "disabled");
    expect(names()).toEqual(["Milo Finch"]);
    // The status is a word, not only a colour.
    expect(within(screen.getByRole("table")).getByText("Disabled")).toBeInTheDocument();
    await userEvent.selectOptions(screen.getByLabelText("Status"), "invited");
    await userEvent.type(screen.getByLabelText("Search by name or e-mail"), "nobody at all");
    expect(screen.getByText("No one matches.")).toBeInTheDocument();
  });

  it("when a row's Edit button is pressed, then that person is handed to onEdit", async () => {
    const onEdit = vi.fn();
    render(<PeopleTable people={people} digesterNames={new Map()} onEdit={onEdit} />);
    await userEvent.click(screen.getByRole("button", { name: "Edit Alma Reed" }));
    expect(onEdit).toHaveBeenCalledWith(expect.objectContaining({ id: 2 }));
  });
});
