import { redirect, useLocation, useNavigate, useSearchParams, type LoaderFunctionArgs } from "react-router-dom";
import type { QueryClient } from "@tanstack/react-query";
import { Alert, PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { SignInForm } from "@/features/auth/components/sign-in-form";
import { safeNext } from "@/features/auth/utils/safe-next";

type Notice = { signedOut?: boolean; expired?: boolean; passwordChanged?: boolean } | null;

function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const notice = useLocation().state as Notice;
  const next = safeNext(params.get("next"));
  return (
    <>
      <PageHeader
        title="Sign in"
        description="Hearthloop is by invitation: your neighbourhood's coordinator sends you a link to set up your account."
      />
      <div className="flex flex-col gap-6">
        {notice?.signedOut ? <Alert variant="success" title="You have signed out" /> : null}
        {notice?.expired ? (
          <Alert variant="info" title="Your session ended">
            <p>For your security you were signed out. Sign in again to carry on where you were.</p>
          </Alert>
        ) : null}
        {notice?.passwordChanged ? (
          <Alert variant="success" title="Password changed">
            <p>Sign in with your new password.</p>
          </Alert>
        ) : null}
        <h2 id="sign-in-heading" className="sr-only">
          Sign-in form
        </h2>
        <SignInForm onSignedIn={() => navigate(next ?? paths.home(), { replace: true })} />
      </div>
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    // Someone already signed in goes straight on.
    loader: async ({ request }: LoaderFunctionArgs) => {
      const user = await queryClient.ensureQueryData(meQueryOptions()).catch(() => null);
      if (user) throw redirect(safeNext(new URL(request.url).searchParams.get("next")) ?? paths.home());
      return null;
    },
    Component: SignInPage,
    ErrorBoundary: RouteError,
  };
}
