import { DIGESTATE_CAUTIONS, GAS_CAUTIONS, PRESSURE_CAUTIONS } from "@shared/domain";
import { Alert, Caution, Card, CardContent, CardHeader, CardTitle, PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { FeedBudgetCalculator } from "@/features/planning/components/feed-budget-calculator";
import { FertiliserCalculator } from "@/features/planning/components/fertiliser-calculator";
import { GasHolderCalculator } from "@/features/planning/components/gas-holder-calculator";
import { PlanSection } from "@/features/planning/components/plan-section";
import { SeasonGasPlanner } from "@/features/planning/components/season-gas-planner";
import { SizingCalculator } from "@/features/planning/components/sizing-calculator";
import { TitrationCalculator } from "@/features/planning/components/titration-calculator";
import { WeightsCalculator } from "@/features/planning/components/weights-calculator";

const sections = [
  { id: "size", title: "How big a digester?" },
  { id: "gas", title: "Gas and cooking time by season" },
  { id: "pressure", title: "Gas holder and pressure" },
  { id: "acids", title: "Acid check" },
  { id: "fertiliser", title: "Fertiliser for a garden bed" },
  { id: "budget", title: "Try a feed budget" },
] as const;

const title = (id: (typeof sections)[number]["id"]) => sections.find((section) => section.id === id)?.title ?? id;

function PlanPage() {
  return (
    <>
      <PageHeader
        title="Plan a digester"
        description="Work out the size of a neighbourhood digester, the gas it can give through the year, the weight on its gas holder, and what its readings mean. No sign-in needed; nothing you type is stored."
      />
      <Alert variant="info" title="Estimates, not a design" announce="off" className="mb-6 max-w-3xl">
        <p>
          Every figure here is an estimate from published formulas and typical values. Local gas, building, waste and
          animal-by-product rules, the supplier&apos;s instructions and licensed practitioners decide how a digester is
          built and run.
        </p>
      </Alert>
      <nav aria-label="On this page" className="mb-8">
        <h2 className="mb-2 text-lg font-bold">On this page</h2>
        <ul className="flex flex-wrap gap-x-4 gap-y-1">
          {sections.map((section) => (
            <li key={section.id}>
              <a href={`#${section.id}`} className="inline-flex min-h-11 items-center font-bold text-primary underline">
                {section.title}
              </a>
            </li>
          ))}
        </ul>
      </nav>

      <div className="flex flex-col gap-10">
        <PlanSection
          id="size"
          title={title("size")}
          intro={
            <p>
              A digester needs room for each day&apos;s scraps and water to stay long enough for the microbes (at least
              40 days when warm, 100 when below 20 °C), and enough volume that the scraps never overload it.
            </p>
          }
        >
          <SizingCalculator />
        </PlanSection>

        <PlanSection
          id="gas"
          title={title("gas")}
          intro={
            <p>
              Methane-forming microbes slow down in the cold, and a cold digester can safely take less feed, so winter
              gives much less gas. The example below is a 2 m³ digester fed 8 kg of scraps a day; put in your own
              figures.
            </p>
          }
        >
          <div className="grid grid-cols-1 gap-6 lg:grid-cols-3">
            <div className="lg:col-span-2">
              <SeasonGasPlanner />
            </div>
            <Caution items={[...GAS_CAUTIONS]} title="Safety with biogas" headingLevel={3} className="self-start" />
          </div>
        </PlanSection>

        <PlanSection
          id="pressure"
          title={title("pressure")}
          intro={
            <p>
              The weight of a floating drum sets the gas pressure at the burner. Adding weights gives a steadier flame,
              but the pressure must suit the stove.
            </p>
          }
        >
          <div className="grid grid-cols-1 gap-6 lg:grid-cols-3">
            <div className="flex flex-col gap-6 lg:col-span-2">
              <Card>
                <CardHeader>
                  <CardTitle level={3}>Pressure and stored gas</CardTitle>
                </CardHeader>
                <CardContent>
                  <GasHolderCalculator />
                </CardContent>
              </Card>
              <Card>
                <CardHeader>
                  <CardTitle level={3}>How much weight on the drum for a steadier flame</CardTitle>
                </CardHeader>
                <CardContent>
                  <WeightsCalculator />
                </CardContent>
              </Card>
            </div>
            <Caution
              items={[...PRESSURE_CAUTIONS, ...GAS_CAUTIONS]}
              title="Safety with the gas holder"
              headingLevel={3}
              className="self-start"
            />
          </div>
        </PlanSection>

        <PlanSection
          id="acids"
          title={title("acids")}
          intro={
            <p>
              A titration of a 20 mL sample with 0.1 N sulphuric acid (the Nordmann method) tells how many acids the
              digester holds against its buffer. Note the acid used to reach pH 5.0 (A) and then to pH 4.4 (B).
            </p>
          }
        >
          <div className="max-w-3xl">
            <TitrationCalculator />
          </div>
        </PlanSection>

        <PlanSection
          id="fertiliser"
          title={title("fertiliser")}
          intro={
            <p>
              The liquid that overflows from a digester carries the nitrogen of the scraps. A bed can take only so much
              in a year.
            </p>
          }
        >
          <div className="grid grid-cols-1 gap-6 lg:grid-cols-3">
            <div className="lg:col-span-2">
              <FertiliserCalculator />
            </div>
            <Caution
              items={[...DIGESTATE_CAUTIONS]}
              title="Safety with digestate"
              headingLevel={3}
              className="self-start"
            />
          </div>
        </PlanSection>

        <PlanSection
          id="budget"
          title={title("budget")}
          intro={
            <p>
              How much a digester may take today, from its volume, temperature and pH. Signed-in stewards see the full
              budget, with the feeding history and start-up of their own digester.
            </p>
          }
        >
          <div className="max-w-3xl">
            <FeedBudgetCalculator />
          </div>
        </PlanSection>
      </div>
    </>
  );
}

export const route = { Component: PlanPage, ErrorBoundary: RouteError };
