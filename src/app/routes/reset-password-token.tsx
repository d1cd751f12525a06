import { Link, useNavigate, useParams } from "react-router-dom";
import { Alert, PageHeader, Spinner } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { ApiError } from "@/lib/api-client";
import { useResetLink } from "@/features/auth/api/check-reset-link";
import { NewPasswordForm } from "@/features/auth/components/new-password-form";

function ResetPasswordTokenPage() {
  const token = useParams().token ?? "";
  const navigate = useNavigate();
  const link = useResetLink(token);
  return (
    <>
      <PageHeader title="Choose a new password" />
      {link.isPending ? <Spinner label="Checking the link" /> : null}
      {link.isError ? (
        <div className="flex flex-col gap-4">
          <Alert variant="danger" title="This link cannot be used" announce="assertive">
            <p>{link.error instanceof ApiError ? link.error.message : "The link could not be checked. Try again."}</p>
          </Alert>
          <p>
            <Link to={paths.resetPassword()} className="inline-flex min-h-11 items-center underline">
              Ask for a new link
            </Link>
          </p>
        </div>
      ) : null}
      {link.isSuccess ? (
        <NewPasswordForm
          token={token}
          onDone={() => navigate(paths.signIn(), { replace: true, state: { passwordChanged: true } })}
        />
      ) : null}
    </>
  );
}

export const route = { Component: ResetPasswordTokenPage, ErrorBoundary: RouteError };
