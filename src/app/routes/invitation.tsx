import { Link, useNavigate, useParams } from "react-router-dom";
import { Alert, PageHeader, Spinner } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { ApiError } from "@/lib/api-client";
import { useInvitation } from "@/features/auth/api/get-invitation";
import { InvitationForm } from "@/features/auth/components/invitation-form";

function InvitationPage() {
  const token = useParams().token ?? "";
  const navigate = useNavigate();
  const invitation = useInvitation(token);
  return (
    <>
      <PageHeader
        title="Join Hearthloop"
        description="Your neighbourhood uses Hearthloop to feed its food scraps to the shared biogas digesters at a pace they can take."
      />
      {invitation.isPending ? <Spinner label="Checking the invitation" /> : null}
      {invitation.isError ? (
        <div className="flex flex-col gap-4">
          <Alert variant="danger" title="This invitation cannot be used" announce="assertive">
            <p>
              {invitation.error instanceof ApiError
                ? invitation.error.message
                : "The invitation could not be checked. Try again."}
            </p>
          </Alert>
          <p>
            <Link to={paths.signIn()} className="inline-flex min-h-11 items-center underline">
              Go to sign in
            </Link>
          </p>
        </div>
      ) : null}
      {invitation.isSuccess ? (
        <InvitationForm
          token={token}
          invitation={invitation.data}
          onAccepted={() => navigate(paths.account(), { replace: true, state: { welcome: true } })}
        />
      ) : null}
    </>
  );
}

export const route = { Component: InvitationPage, ErrorBoundary: RouteError };
