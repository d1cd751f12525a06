import { Link } from "react-router-dom";
import { buttonClasses, Card, CardContent, CardHeader, CardTitle, PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";

const jobs = [
  {
    title: "Residents",
    text: "Log each bucket of sorted scraps, see which digester takes it today, ask for a collection if you cannot carry, and see what your scraps became.",
  },
  {
    title: "Stewards",
    text: "See today's feed budget for each digester, accept or turn away drop-offs, log temperature and pH, and get warned before a digester turns sour.",
  },
  {
    title: "Coordinators",
    text: "Share households between digesters so none is overfed and nobody walks far, plan collection rounds for cargo bikes, and report totals.",
  },
  {
    title: "Gardeners",
    text: "See how much liquid fertiliser each digester has, claim a pickup, and get dilution advice for the size of your beds.",
  },
];

function LandingPage() {
  return (
    <>
      <PageHeader
        title="Food scraps into cooking gas, at a pace the digesters can take"
        description="Hearthloop is the shared board of a neighbourhood that feeds its sorted food scraps to small biogas digesters."
        actions={
          <Link to={paths.map()} className={buttonClasses("primary", "lg")}>
            See the digester map
          </Link>
        }
      />
      <section aria-labelledby="why-heading" className="mb-8 max-w-3xl">
        <h2 id="why-heading" className="mb-2 text-2xl font-bold">
          Why pacing matters
        </h2>
        <p>
          The microbes that make methane are slow and sensitive. A digester fed too much easily-rotting food in a short
          time turns sour: acids pile up, gas stops, and it needs weeks of rest. Hearthloop works out how much each
          digester can safely take today from its size, its temperature and its latest readings, and sends surplus
          scraps to a digester with room.
        </p>
      </section>
      <section aria-labelledby="who-heading">
        <h2 id="who-heading" className="mb-4 text-2xl font-bold">
          Who it is for
        </h2>
        <ul className="grid gap-4 sm:grid-cols-2">
          {jobs.map((job) => (
            <li key={job.title}>
              <Card className="h-full">
                <CardHeader>
                  <CardTitle level={3}>{job.title}</CardTitle>
                </CardHeader>
                <CardContent>
                  <p>{job.text}</p>
                </CardContent>
              </Card>
            </li>
          ))}
        </ul>
      </section>
    </>
  );
}

export const route = { Component: LandingPage, ErrorBoundary: RouteError };
