import { useMemo, useRef, type KeyboardEvent, type ReactNode } from "react";
import { Link } from "react-router-dom";
import { Marker, Popup } from "react-leaflet";
import type { LatLngBoundsExpression, Marker as LeafletMarker } from "leaflet";
import type { DigesterSummary } from "@shared/schemas/digester";
import type { HouseholdRow } from "@shared/schemas/households";
import { BaseMap } from "@/components/map/base-map";
import { textMarker } from "@/components/map/marker-icon";
import { Badge, Button, buttonClasses, Table, TableCaption, TBody, TD, TH, THead, TR } from "@/components/ui";
import { paths } from "@/config/paths";
import { digesterState, type DigesterState } from "../utils/digester-state";

type Point = { lat: number; lng: number };

function boundsOf(points: Point[]): LatLngBoundsExpression | undefined {
  if (points.length === 0) return undefined;
  const lats = points.map((p) => p.lat);
  const lngs = points.map((p) => p.lng);
  const pad = 0.002;
  return [
    [Math.min(...lats) - pad, Math.min(...lngs) - pad],
    [Math.max(...lats) + pad, Math.max(...lngs) + pad],
  ];
}

/**
 * Popups that keyboard users can leave: on opening, focus moves into the popup; Escape (or the
 * close button) closes it and focus goes back to whatever opened it — the marker or the list's
 * "Show on map" button.
 */
function usePopupFocus() {
  const opener = useRef<HTMLElement | null>(null);
  const markers = useRef(new Map<string, LeafletMarker>());
  return {
    register: (key: string) => (marker: LeafletMarker | null) => {
      if (marker) markers.current.set(key, marker);
      else markers.current.delete(key);
    },
    open: (key: string, from: HTMLElement) => {
      opener.current = from;
      markers.current.get(key)?.openPopup();
    },
    handlers: (key: string) => ({
      popupopen: () => {
        const marker = markers.current.get(key);
        const active = document.activeElement;
        // Opened from the marker itself (click or Enter): return there.
        if (
          !opener.current ||
          !(active instanceof HTMLElement) ||
          active === document.body ||
          marker?.getElement()?.contains(active)
        ) {
          opener.current = marker?.getElement() ?? null;
        }
        requestAnimationFrame(() =>
          marker?.getPopup()?.getElement()?.querySelector<HTMLElement>("[data-popup-body]")?.focus(),
        );
      },
      popupclose: () => {
        const back = opener.current;
        opener.current = null;
        const popupHadFocus =
          !document.activeElement ||
          document.activeElement === document.body ||
          markers.current.get(key)?.getPopup()?.getElement()?.contains(document.activeElement);
        if (back && popupHadFocus) requestAnimationFrame(() => back.focus());
      },
    }),
    closeOnEscape: (key: string) => (event: KeyboardEvent) => {
      if (event.key !== "Escape") return;
      event.preventDefault();
      event.stopPropagation();
      markers.current.get(key)?.closePopup();
    },
  };
}

function PopupBody({
  label,
  onKeyDown,
  children,
}: {
  label: string;
  onKeyDown: (e: KeyboardEvent) => void;
  children: ReactNode;
}) {
  return (
    <div
      data-popup-body
      tabIndex={-1}
      role="group"
      aria-label={label}
      onKeyDown={onKeyDown}
      className="flex flex-col gap-1 text-base focus:outline-none"
    >
      {children}
    </div>
  );
}

export type NeighbourhoodMapProps = {
  digesters: DigesterSummary[];
  /** The households this person may see: all for coordinators, their own for everyone else. */
  households: HouseholdRow[];
  /** Shows "Log a drop-off here" (residents with a household). */
  canLogDropOff: boolean;
};

/**
 * The signed-in map: every digester with its state today by symbol and words, the person's own
 * household (coordinators: every household), and beside it a list with the same facts and
 * actions for keyboard and screen-reader users.
 */
export function NeighbourhoodMap({ digesters, households, canLogDropOff }: NeighbourhoodMapProps) {
  const popups = usePopupFocus();
  const states = useMemo(() => new Map(digesters.map((d) => [d.id, digesterState(d)])), [digesters]);
  const mine = households.find((h) => h.isMine) ?? null;
  const others = households.filter((h) => !h.isMine && h.location !== null);
  const bounds = boundsOf([...digesters.map((d) => d.location), ...(mine?.location ? [mine.location] : [])]);
  const centre = digesters[0]?.location ?? mine?.location ?? { lat: 0, lng: 0 };

  const logLink = (d: DigesterSummary, state: DigesterState, className?: string) =>
    canLogDropOff && state.takesScraps ? (
      <Link to={paths.logDropOff(d.id)} className={className ?? buttonClasses("primary", "sm")}>
        Log a drop-off here<span className="sr-only">: {d.name}</span>
      </Link>
    ) : null;

  return (
    <div className="grid grid-cols-[minmax(0,1fr)] gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <BaseMap
        label="Map of digesters and their room today"
        center={[centre.lat, centre.lng]}
        bounds={bounds}
        className="h-[28rem] min-h-80 w-full lg:h-[36rem]"
      >
        {others.map((h) => (
          <Marker
            key={`h${h.id}`}
            position={[h.location!.lat, h.location!.lng]}
            icon={textMarker("household", h.name)}
            keyboard={false}
            interactive={false}
          />
        ))}
        {mine?.location ? (
          <Marker
            position={[mine.location.lat, mine.location.lng]}
            icon={textMarker("home", "Your home")}
            keyboard={false}
            interactive={false}
          />
        ) : null}
        {digesters.map((d) => {
          const state = states.get(d.id)!;
          const key = `d${d.id}`;
          return (
            <Marker
              key={key}
              ref={popups.register(key)}
              position={[d.location.lat, d.location.lng]}
              icon={textMarker(state.tone, `${d.name} · ${state.short}`)}
              title={`${d.name}: ${state.words}`}
              // Digesters stay above the household symbols around them.
              zIndexOffset={1000}
              eventHandlers={popups.handlers(key)}
            >
              <Popup>
                <PopupBody label={d.name} onKeyDown={popups.closeOnEscape(key)}>
                  <strong className="text-lg">{d.name}</strong>
                  <span>{state.words}</span>
                  {logLink(d, state, "font-bold underline")}
                </PopupBody>
              </Popup>
            </Marker>
          );
        })}
      </BaseMap>

      <section aria-labelledby="map-list-heading" className="flex flex-col gap-4">
        <h2 id="map-list-heading" className="text-2xl font-bold">
          Digesters today
        </h2>
        <ul className="flex flex-col gap-3">
          {digesters.map((d) => {
            const state = states.get(d.id)!;
            return (
              <li key={d.id} className="flex flex-col gap-2 rounded-md border border-border bg-surface p-3">
                <h3 className="text-lg font-bold">{d.name}</h3>
                {d.siteDescription ? <p className="text-base text-muted">{d.siteDescription}</p> : null}
                <p className="flex flex-wrap items-center gap-2">
                  <Badge tone={state.badge}>{state.short}</Badge>
                </p>
                <p>{state.words}</p>
                <div className="flex flex-wrap gap-2">
                  {logLink(d, state)}
                  <Button
                    type="button"
                    variant="outline"
                    size="sm"
                    onClick={(e) => popups.open(`d${d.id}`, e.currentTarget)}
                  >
                    Show on map<span className="sr-only">: {d.name}</span>
                  </Button>
                </div>
              </li>
            );
          })}
        </ul>
        {mine ? (
          <p>
            <span aria-hidden="true">⌂ </span>
            Your home, {mine.name}
            {mine.addressText ? `, ${mine.addressText}` : ""}, is on the map
            {mine.location ? "" : " once you add where it is"}.
          </p>
        ) : null}
        {others.length > 0 ? (
          <Table label="Households on the map">
            <TableCaption>Households ({households.length})</TableCaption>
            <THead>
              <TR>
                <TH>Household</TH>
                <TH>Address</TH>
                <TH>Digester</TH>
                <TH>Members</TH>
              </TR>
            </THead>
            <TBody>
              {households.map((h) => (
                <TR key={h.id}>
                  <TD>{h.name}</TD>
                  <TD>{h.addressText || "—"}</TD>
                  <TD>{h.assignedDigesterName ?? "Not assigned yet"}</TD>
                  <TD>{h.memberCount}</TD>
                </TR>
              ))}
            </TBody>
          </Table>
        ) : null}
      </section>
    </div>
  );
}
