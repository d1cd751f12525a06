import { useEffect, useId, useMemo, useState } from "react";
import { Marker, useMapEvents } from "react-leaflet";
import type { LatLngBoundsExpression } from "leaflet";
import type { Street } from "@shared/schemas/households";
import { BaseMap } from "@/components/map/base-map";
import { textMarker } from "@/components/map/marker-icon";
import { Field, FieldError, Input, Select } from "@/components/ui";
import { readNumber } from "@/lib/form";

export type LatLng = { lat: number; lng: number };

function ClickToPlace({ onPlace }: { onPlace: (point: LatLng) => void }) {
  useMapEvents({ click: (event) => onPlace({ lat: round6(event.latlng.lat), lng: round6(event.latlng.lng) }) });
  return null;
}

const round6 = (v: number) => Math.round(v * 1e6) / 1e6;

function boundsOf(points: LatLng[]): LatLngBoundsExpression | undefined {
  if (points.length === 0) return undefined;
  const lats = points.map((p) => p.lat);
  const lngs = points.map((p) => p.lng);
  return [
    [Math.min(...lats), Math.min(...lngs)],
    [Math.max(...lats), Math.max(...lngs)],
  ];
}

export type LocationPickerProps = {
  value: LatLng | null;
  onChange: (value: LatLng | null) => void;
  streets: Street[];
  /** Called with the street's name when one is picked from the list (to fill an empty address). */
  onStreetPicked?: (name: string) => void;
  /** Messages for "location", "location.lat" and "location.lng". */
  errors: Record<string, string | undefined>;
};

/**
 * Three ways to place a home, all kept in step: pick a street from the list (keyboard and
 * screen-reader friendly; places the home halfway along it), tap the map, or type coordinates.
 */
export function LocationPicker({ value, onChange, streets, onStreetPicked, errors }: LocationPickerProps) {
  const id = useId();
  const [street, setStreet] = useState("");
  const [latText, setLatText] = useState(value ? String(value.lat) : "");
  const [lngText, setLngText] = useState(value ? String(value.lng) : "");
  const bounds = useMemo(() => boundsOf(streets.map((s) => s.location)), [streets]);
  const centre = streets[0]?.location ?? value ?? { lat: 0, lng: 0 };

  // A point from the map or the street list shows in the coordinate fields too.
  useEffect(() => {
    if (!value) return;
    if (readNumber(latText) !== value.lat) setLatText(String(value.lat));
    if (readNumber(lngText) !== value.lng) setLngText(String(value.lng));
    // Only a new point should rewrite the fields, never the person's typing.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value?.lat, value?.lng]);

  const typed = (lat: string, lng: string) => {
    setLatText(lat);
    setLngText(lng);
    setStreet("");
    const la = readNumber(lat);
    const ln = readNumber(lng);
    onChange(typeof la === "number" && typeof ln === "number" ? { lat: la, lng: ln } : null);
  };

  const locationError = errors.location;
  return (
    <fieldset
      className="flex min-w-0 flex-col gap-4"
      aria-describedby={`${id}-hint${locationError ? ` ${id}-error` : ""}`}
    >
      <legend className="mb-1 text-xl font-bold">Where is your home?</legend>
      <p id={`${id}-hint`} className="text-base text-muted">
        Pick your street, tap your home on the map, or type its coordinates. Your coordinators see it on their map;
        other residents do not.
      </p>
      {locationError ? <FieldError id={`${id}-error`}>{locationError}</FieldError> : null}
      <Field label="Your street" hint="Places your home halfway along the street; move it on the map if you like.">
        <Select
          value={street}
          placeholder="Choose your street"
          options={streets.map((s) => ({ value: s.name, label: s.name }))}
          onChange={(event) => {
            const picked = streets.find((s) => s.name === event.target.value);
            setStreet(event.target.value);
            if (picked) {
              onChange(picked.location);
              onStreetPicked?.(picked.name);
            }
          }}
        />
      </Field>
      <div>
        <p className="mb-1.5 font-bold" id={`${id}-map-label`}>
          Or tap your home on the map
        </p>
        <BaseMap
          label="Map for placing your home: tap where your home is"
          center={[centre.lat, centre.lng]}
          bounds={bounds}
          className="h-72 w-full"
        >
          <ClickToPlace
            onPlace={(point) => {
              setStreet("");
              onChange(point);
            }}
          />
          {value ? (
            <Marker position={[value.lat, value.lng]} icon={textMarker("home", "Your home")} keyboard={false} />
          ) : null}
        </BaseMap>
      </div>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Or type the latitude (°)" hint="For example 53.2741" error={errors["location.lat"]}>
          <Input
            inputMode="decimal"
            autoComplete="off"
            value={latText}
            onChange={(event) => typed(event.target.value, lngText)}
          />
        </Field>
        <Field label="Longitude (°)" hint="For example -1.6123" error={errors["location.lng"]}>
          <Input
            inputMode="decimal"
            autoComplete="off"
            value={lngText}
            onChange={(event) => typed(latText, event.target.value)}
          />
        </Field>
      </div>
    </fieldset>
  );
}
