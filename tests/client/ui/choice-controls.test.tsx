import { describe, expect, it, vi } from "vitest";
import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { Checkbox } from "@/components/ui/checkbox";
import { RadioGroup } from "@/components/ui/radio-group";

const options = [
  { value: "drop-off", label: "I bring it", description: "To the digester in your time window" },
  { value: "collection", label: "Please collect", description: "A volunteer picks it up" },
];

describe("RadioGroup", () => {
  it("when rendered, then it is a group named by its legend and each card's text labels its radio", () => {
    render(<RadioGroup legend="How does the bucket travel?" options={options} />);
    const group = screen.getByRole("radiogroup", { name: "How does the bucket travel?" });
    expect(group.tagName).toBe("FIELDSET");
    const radio = screen.getByRole("radio", { name: /Please collect/ });
    expect(radio).toHaveAccessibleDescription("A volunteer picks it up");
  });

  it("when a card's text is clicked, then that option is chosen and reported", async () => {
    const onValueChange = vi.fn();
    render(<RadioGroup legend="How does the bucket travel?" options={options} onValueChange={onValueChange} />);
    await userEvent.click(screen.getByText("Please collect"));
    expect(screen.getByRole("radio", { name: /Please collect/ })).toBeChecked();
    expect(onValueChange).toHaveBeenCalledWith("collection");
  });

  it("when it has an error, then the group is invalid and described by the error text", () => {
    render(
      <RadioGroup id="travel" legend="How does the bucket travel?" options={options} error="Choose one" required />,
    );
    const group = screen.getByRole("radiogroup", { name: /How does the bucket travel\?/ });
    expect(group).toHaveAttribute("aria-invalid", "true");
    expect(group).toHaveAttribute("aria-required", "true");
    expect(group).toHaveAttribute("aria-describedby", "travel-error");
    expect(document.getElementById("travel-error")).toHaveTextContent("Choose one");
  });
});

describe("Checkbox", () => {
  it("when its label is clicked, then it toggles; with an error it is invalid and described", async () => {
    render(<Checkbox label="Remind me the evening before" error="Add an e-mail address first" />);
    const box = screen.getByRole("checkbox", { name: "Remind me the evening before" });
    expect(box).not.toBeChecked();
    await userEvent.click(screen.getByText("Remind me the evening before"));
    expect(box).toBeChecked();
    expect(box).toHaveAttribute("aria-invalid", "true");
    expect(box).toHaveAccessibleDescription("Error: Add an e-mail address first");
  });
});
