import { isRouteErrorResponse, Link, useRouteError } from "react-router-dom";
import { Alert, buttonClasses } from "@/components/ui";
import { ApiError } from "@/lib/api-client";

/** The error boundary of every route: says what went wrong in plain words, never a stack. */
export function RouteError({ standalone = false }: { standalone?: boolean }) {
  const error = useRouteError();
  let title = "Something went wrong";
  let message = "This page could not be shown. Please try again.";
  if (isRouteErrorResponse(error)) {
    title = error.status === 404 ? "Page not found" : `Error ${error.status}`;
    message = error.statusText || message;
  } else if (error instanceof ApiError) {
    message = error.message;
  }
  // Inside the app shell the page already has its <main>; only the root boundary stands alone.
  const Container = standalone ? "main" : "div";
  return (
    <Container {...(standalone ? { id: "main", tabIndex: -1 } : {})} className="mx-auto max-w-3xl p-4 sm:p-6">
      <Alert variant="danger" title={title} announce="assertive">
        <p>{message}</p>
      </Alert>
      <p className="mt-4">
        <Link to="/" className={buttonClasses("outline")}>
          Go to the start page
        </Link>
      </p>
    </Container>
  );
}
