import { Link } from "react-router-dom";
import { buttonClasses, PageHeader } from "@/components/ui";

function NotFoundPage() {
  return (
    <>
      <PageHeader title="Page not found" description="There is no page at this address." />
      <Link to="/" className={buttonClasses("outline")}>
        Go to the start page
      </Link>
    </>
  );
}

export const route = { Component: NotFoundPage };
