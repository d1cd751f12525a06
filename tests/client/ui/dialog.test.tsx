import { afterEach, describe, expect, it } from "vitest";
import { useState } from "react";
import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";

function Harness() {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button type="button" onClick={() => setOpen(true)}>
        Set to resting
      </Button>
      <Dialog
        open={open}
        onClose={() => setOpen(false)}
        title="Rest this digester?"
        description="No drop-offs are accepted while it rests."
        footer={
          <Button type="button" onClick={() => setOpen(false)}>
            Keep feeding
          </Button>
        }
      >
        <p>Residents assigned to it are moved to other digesters.</p>
      </Dialog>
    </>
  );
}

async function openDialog() {
  const user = userEvent.setup();
  render(<Harness />);
  const opener = screen.getByRole("button", { name: "Set to resting" });
  await user.click(opener);
  const dialog = screen.getByRole("dialog", { name: "Rest this digester?" });
  return { user, opener, dialog };
}

describe("Dialog", () => {
  const nativeShowModal = HTMLDialogElement.prototype.showModal;
  afterEach(() => {
    HTMLDialogElement.prototype.showModal = nativeShowModal;
  });

  it("when opened, then it is open, named by its title, described, and holds focus", async () => {
    const { dialog } = await openDialog();
    expect(dialog).toHaveAttribute("open");
    expect(dialog).toHaveAccessibleDescription("No drop-offs are accepted while it rests.");
    expect(dialog.contains(document.activeElement)).toBe(true);
  });

  it("when Escape is pressed, then it closes and focus returns to the opener", async () => {
    const { user, opener, dialog } = await openDialog();
    await user.keyboard("{Escape}");
    expect(dialog).not.toHaveAttribute("open");
    expect(screen.queryByText("Residents assigned to it are moved to other digesters.")).toBeNull();
    expect(opener).toHaveFocus();
  });

  it("when the close button is used, then it closes and focus returns to the opener", async () => {
    const { user, opener, dialog } = await openDialog();
    await user.click(screen.getByRole("button", { name: "Close" }));
    expect(dialog).not.toHaveAttribute("open");
    expect(opener).toHaveFocus();
  });

  it("when the DOM has no showModal, then the open attribute still shows it and Escape still closes it", async () => {
    // @ts-expect-error -- simulating a DOM without the method
    HTMLDialogElement.prototype.showModal = undefined;
    const { user, opener, dialog } = await openDialog();
    expect(dialog).toHaveAttribute("open");
    await user.keyboard("{Escape}");
    expect(dialog).not.toHaveAttribute("open");
    expect(opener).toHaveFocus();
  });
});
