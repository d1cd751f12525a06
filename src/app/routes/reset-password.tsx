import { Link } from "react-router-dom";
import { PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { RequestResetForm } from "@/features/auth/components/request-reset-form";

function ResetPasswordPage() {
  return (
    <>
      <PageHeader
        title="Reset your password"
        description="Type the e-mail address you sign in with. We send it a link to choose a new password."
      />
      <div className="flex flex-col gap-6">
        <RequestResetForm />
        <p>
          <Link to={paths.signIn()} className="inline-flex min-h-11 items-center underline">
            Back to sign in
          </Link>
        </p>
      </div>
    </>
  );
}

export const route = { Component: ResetPasswordPage, ErrorBoundary: RouteError };
