import { describe, expect, it } from "vitest";
import { render, screen } from "@testing-library/react";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";

describe("Field", () => {
  it("when it wraps an input, then the input is found by its visible label and described by the hint", () => {
    render(
      <Field id="bucket-volume" label="Bucket volume" hint="In litres, as printed on the bucket">
        <Input />
      </Field>,
    );
    const input = screen.getByLabelText("Bucket volume");
    expect(input).toHaveAttribute("id", "bucket-volume");
    expect(input).not.toHaveAttribute("aria-invalid");
    expect(input).toHaveAttribute("aria-describedby", "bucket-volume-hint");
    expect(input).toHaveAccessibleDescription("In litres, as printed on the bucket");
  });

  it("when it has an error, then the input is invalid, described by hint and error, and the error text is shown", () => {
    render(
      <Field id="bucket-volume" label="Bucket volume" hint="In litres" error="Enter a volume above 0 L">
        <Input />
      </Field>,
    );
    const input = screen.getByRole("textbox", { name: "Bucket volume" });
    expect(input).toHaveAttribute("aria-invalid", "true");
    expect(input).toHaveAttribute("aria-describedby", "bucket-volume-hint bucket-volume-error");
    expect(input).toHaveAccessibleDescription("In litres Error: Enter a volume above 0 L");
    const error = document.getElementById("bucket-volume-error");
    expect(error).toHaveTextContent("Enter a volume above 0 L");
  });

  it("when required, then the control says so to assistive technology and the label says it in words", () => {
    render(
      <Field label="Street" required>
        <Input />
      </Field>,
    );
    const input = screen.getByRole("textbox", { name: "Street" });
    expect(input).toHaveAttribute("aria-required", "true");
    expect(screen.getByText("(required)")).toBeInTheDocument();
  });

  it("when no id is given, then one is generated and still links label, control and error", () => {
    render(
      <Field label="Digester" error="Choose a digester">
        <Select placeholder="Choose…" options={[{ value: "d1", label: "Hollow Lane tank" }]} />
      </Field>,
    );
    const select = screen.getByRole("combobox", { name: "Digester" });
    const id = select.getAttribute("id");
    expect(id).toBeTruthy();
    expect(select).toHaveAttribute("aria-describedby", `${id}-error`);
    expect(select).toHaveAccessibleDescription("Error: Choose a digester");
  });

  it("when the control brings its own aria-describedby, then Field keeps it and adds its own", () => {
    render(
      <>
        <p id="unit-note">Kilograms</p>
        <Field id="mass" label="Mass" error="Too heavy for one bucket">
          <Input aria-describedby="unit-note" />
        </Field>
      </>,
    );
    expect(screen.getByLabelText("Mass")).toHaveAttribute("aria-describedby", "unit-note mass-error");
  });

  it("when given a render function, then it receives the wiring props", () => {
    render(
      <Field id="notes" label="Notes" error="Too long">
        {(control) => <textarea {...control} />}
      </Field>,
    );
    const textarea = screen.getByRole("textbox", { name: "Notes" });
    expect(textarea).toHaveAttribute("aria-invalid", "true");
    expect(textarea).toHaveAttribute("aria-describedby", "notes-error");
  });
});
