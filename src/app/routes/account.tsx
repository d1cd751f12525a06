import { useLocation, type LoaderFunctionArgs } from "react-router-dom";
import { useQueryClient, useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import type { SessionUser } from "@shared/schemas/auth";
import { Alert, PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { authKeys } from "@/features/auth/api/keys";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { requireUser } from "@/features/auth/utils/require-user";
import { EmailForm } from "@/features/account/components/email-form";
import { NameForm } from "@/features/account/components/name-form";
import { PasswordForm } from "@/features/account/components/password-form";

const roleWords: Record<string, string> = {
  resident: "resident",
  steward: "steward",
  coordinator: "coordinator",
  gardener: "gardener",
};

function AccountPage() {
  const { data: user } = useSuspenseQuery(meQueryOptions());
  const queryClient = useQueryClient();
  const welcome = (useLocation().state as { welcome?: boolean } | null)?.welcome;
  if (!user) return null;
  const onUpdated = (updated: SessionUser) => queryClient.setQueryData(authKeys.me(), updated);
  return (
    <>
      <PageHeader
        title="Your account"
        description={`Signed in as ${user.name}${user.roles.length ? `, ${user.roles.map((r) => roleWords[r] ?? r).join(", ")}` : ""}.`}
      />
      <div className="flex flex-col gap-10">
        {welcome ? (
          <Alert variant="success" title={`Welcome, ${user.name}`}>
            <p>Your account is ready and you are signed in.</p>
          </Alert>
        ) : null}
        <NameForm user={user} onUpdated={onUpdated} />
        <EmailForm user={user} onUpdated={onUpdated} />
        <PasswordForm email={user.email} />
      </div>
    </>
  );
}

export function createRoute(client: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(client, request);
      return null;
    },
    Component: AccountPage,
    ErrorBoundary: RouteError,
  };
}
