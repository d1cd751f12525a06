import { useCallback, useEffect } from "react";
import { useLocation, useNavigate } from "react-router-dom";
import { useQueryClient } from "@tanstack/react-query";
import { AppShell } from "@/components/layout/app-shell";
import { paths } from "@/config/paths";
import { onUnauthorized, resetSessionState } from "@/lib/api-client";
import { useMe } from "@/features/auth/api/get-me";
import { authKeys } from "@/features/auth/api/keys";
import { useSignOut } from "@/features/auth/api/sign-out";
import { AccountMenu } from "@/features/auth/components/account-menu";
import { SessionExpiryWarning } from "@/features/auth/components/session-expiry-warning";
import { navItemsFor } from "./navigation";

/**
 * The app shell with what depends on who is signed in: role navigation, the account menu and
 * the session-expiry warning. When the session ends (timeout, or a 401 from any request), the
 * person lands on sign-in and comes back to this page afterwards.
 */
export function RootLayout() {
  const { data: user } = useMe();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const location = useLocation();
  const signOut = useSignOut();
  const here = location.pathname + location.search;

  const endSession = signOut.mutate;
  const sessionEnded = useCallback(() => {
    if (!queryClient.getQueryData(authKeys.me())) return;
    // Sign out on the server too: the client's clock ends a little early, and a shared computer
    // must not keep a live session behind the sign-in page.
    resetSessionState();
    queryClient.setQueryData(authKeys.me(), null);
    endSession(undefined, { onSettled: () => navigate(paths.signIn(here), { state: { expired: true } }) });
  }, [queryClient, navigate, here, endSession]);

  useEffect(
    () =>
      onUnauthorized((url) => {
        // /me answers 401 for visitors by design; any other 401 means the session is gone.
        if (url !== "/api/auth/me" && url !== "/api/auth/login") sessionEnded();
      }),
    [sessionEnded],
  );

  return (
    <AppShell extraNavItems={navItemsFor(user)} accountArea={<AccountMenu user={user} />}>
      {user ? (
        <SessionExpiryWarning
          onExpired={sessionEnded}
          onSignOut={() =>
            signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn(), { state: { signedOut: true } }) })
          }
        />
      ) : null}
    </AppShell>
  );
}
