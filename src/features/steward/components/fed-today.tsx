import type { Feeding } from "@shared/schemas/feedings";
import { Table, TableCaption, TBody, TD, TH, THead, TR } from "@/components/ui";
import { formatNumber, mixLabel } from "../utils/format";

/** What went into the digester today, one row per feeding. */
export function FedToday({ feedings, digesterName }: { feedings: Feeding[]; digesterName: string }) {
  if (feedings.length === 0) return <p>Nothing fed yet today.</p>;
  const totalKg = feedings.reduce((s, f) => s + f.freshKg, 0);
  const totalWater = feedings.reduce((s, f) => s + f.waterLitres, 0);
  return (
    <Table label={`Fed today at ${digesterName}`}>
      <TableCaption>
        Fed today: {formatNumber(totalKg)} kg of scraps with {formatNumber(totalWater)} L of water
      </TableCaption>
      <THead>
        <TR>
          <TH>Time</TH>
          <TH>From</TH>
          <TH>Scraps</TH>
          <TH>Water</TH>
          <TH>By</TH>
        </TR>
      </THead>
      <TBody>
        {feedings.map((f) => (
          <TR key={f.id}>
            <TD>
              {new Intl.DateTimeFormat("en-GB", { hour: "2-digit", minute: "2-digit" }).format(new Date(f.fedAt))}
            </TD>
            <TD>{f.householdName ?? "Added by hand"}</TD>
            <TD>
              {formatNumber(f.freshKg)} kg, {mixLabel(f.mix).toLowerCase()}
              {f.overrideReason ? ` (beyond the budget: “${f.overrideReason}”)` : ""}
            </TD>
            <TD>{formatNumber(f.waterLitres)} L</TD>
            <TD>{f.enteredBy ?? "—"}</TD>
          </TR>
        ))}
      </TBody>
    </Table>
  );
}
