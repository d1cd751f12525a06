import { Link, useNavigate } from "react-router-dom";
import type { SessionUser } from "@shared/schemas/auth";
import { Button, buttonClasses } from "@/components/ui";
import { paths } from "@/config/paths";
import { cn } from "@/lib/cn";
import { useSignOut } from "../api/sign-out";

const onPrimary = "text-primary-foreground hover:bg-primary-foreground/15";

/** The header's account area: who is signed in and a sign-out button, or a sign-in link. */
export function AccountMenu({ user }: { user: SessionUser | null | undefined }) {
  const signOut = useSignOut();
  const navigate = useNavigate();
  if (!user) {
    return (
      <Link to={paths.signIn()} className={cn(buttonClasses("ghost", "sm"), onPrimary, "no-underline")}>
        Sign in
      </Link>
    );
  }
  return (
    <div className="flex flex-wrap items-center gap-2">
      <span className="text-base">
        <span className="sr-only">Signed in as </span>
        {user.name}
      </span>
      <Button
        type="button"
        variant="ghost"
        size="sm"
        className={onPrimary}
        loading={signOut.isPending}
        onClick={() =>
          signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn(), { state: { signedOut: true } }) })
        }
      >
        Sign out
      </Button>
    </div>
  );
}
