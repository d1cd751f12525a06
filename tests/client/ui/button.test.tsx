import { describe, expect, it, vi } from "vitest";
import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { Button, buttonClasses } from "@/components/ui/button";

describe("Button", () => {
  it("when loading, then it is busy and disabled, keeps its name and ignores clicks", async () => {
    const onClick = vi.fn();
    render(
      <Button loading onClick={onClick}>
        Save reading
      </Button>,
    );
    const button = screen.getByRole("button", { name: "Save reading" });
    expect(button).toHaveAttribute("aria-busy", "true");
    expect(button).toBeDisabled();
    expect(button.querySelector("svg")).not.toBeNull();
    await userEvent.click(button);
    expect(onClick).not.toHaveBeenCalled();
  });

  it("when not loading, then it is enabled, not busy and clickable", async () => {
    const onClick = vi.fn();
    render(<Button onClick={onClick}>Save reading</Button>);
    const button = screen.getByRole("button", { name: "Save reading" });
    expect(button).not.toHaveAttribute("aria-busy");
    expect(button).toBeEnabled();
    await userEvent.click(button);
    expect(onClick).toHaveBeenCalledTimes(1);
  });

  it("when small, then it still keeps the 44 px minimum target classes", () => {
    render(<Button size="sm">Edit</Button>);
    const button = screen.getByRole("button", { name: "Edit" });
    expect(button).toHaveClass("min-h-11", "min-w-11");
  });

  it("when a className overrides padding, then the override wins over the size default", () => {
    const classes = buttonClasses("outline", "md", "px-8").split(" ");
    expect(classes).toContain("px-8");
    expect(classes).not.toContain("px-4");
    expect(classes).toContain("border-primary");
  });
});
