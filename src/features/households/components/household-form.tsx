import { useRef, useState, type FormEvent } from "react";
import {
  RegisterHouseholdSchema,
  UpdateHouseholdSchema,
  type Household,
  type Street,
} from "@shared/schemas/households";
import { Alert, Button, Field, Input } from "@/components/ui";
import { useRegisterHousehold } from "../api/register-household";
import { useUpdateHousehold } from "../api/update-household";
import { focusFirstInvalid, readNumber, serverFieldErrors, zodFieldErrors, type FieldErrors } from "@/lib/form";
import { LocationPicker, type LatLng } from "./location-picker";

const FIELDS = ["name", "addressText", "location", "location.lat", "location.lng", "declaredWeeklyKg"] as const;

export type HouseholdFormProps = {
  streets: Street[];
  /** Editing an existing household; absent when registering a new one. */
  household?: Household;
  onSaved?: () => void;
};

/**
 * Register a household (name, address, where it is) or change it. Checked with the shared zod
 * schema before sending and again by the server; every message sits under its field.
 */
export function HouseholdForm({ streets, household, onSaved }: HouseholdFormProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const autoStreet = useRef<string | null>(null);
  const register = useRegisterHousehold({ onRegistered: onSaved });
  const update = useUpdateHousehold();
  const [name, setName] = useState(household?.name ?? "");
  const [addressText, setAddressText] = useState(household?.addressText ?? "");
  const [location, setLocation] = useState<LatLng | null>(household?.location ?? null);
  const [weekly, setWeekly] = useState(household ? String(household.declaredWeeklyKg) : "");
  const [errors, setErrors] = useState<FieldErrors>({});
  const [saved, setSaved] = useState(false);
  const editing = household !== undefined;
  const pending = register.isPending || update.isPending;

  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    setSaved(false);
    const body = {
      name,
      addressText,
      // A half-typed coordinate leaves no point: the schema then says where one is missing.
      location: location ?? undefined,
      declaredWeeklyKg: readNumber(weekly),
    };
    const parsed = (editing ? UpdateHouseholdSchema : RegisterHouseholdSchema).safeParse(body);
    if (!parsed.success) {
      const fields = zodFieldErrors(parsed.error);
      if (fields.location && !location) fields.location = "Choose your street, tap the map or type both coordinates.";
      setErrors(fields);
      focusFirstInvalid(formRef.current);
      return;
    }
    setErrors({});
    try {
      if (editing) {
        await update.mutateAsync(parsed.data);
        setSaved(true);
        onSaved?.();
      } else {
        await register.mutateAsync(RegisterHouseholdSchema.parse(body));
      }
    } catch (err) {
      setErrors(serverFieldErrors(err, FIELDS));
      focusFirstInvalid(formRef.current);
    }
  };

  const count = Object.keys(errors).length;
  return (
    <form
      ref={formRef}
      onSubmit={onSubmit}
      noValidate
      aria-label={editing ? "Change your household" : "Register your household"}
      className="flex flex-col gap-6"
    >
      {count > 0 ? (
        <Alert
          variant="danger"
          title={errors.form ? "Not saved" : `Please check ${count === 1 ? "one field" : `${count} fields`}`}
          announce="assertive"
        >
          {errors.form ? <p>{errors.form}</p> : <p>The problems are written under each field.</p>}
        </Alert>
      ) : null}
      {saved ? <Alert variant="success" title="Household saved" /> : null}
      <Field
        label="Household name"
        hint="How your steward knows you, e.g. your family name or flat number."
        error={errors.name}
        required
      >
        <Input value={name} onChange={(e) => setName(e.target.value)} autoComplete="off" maxLength={120} />
      </Field>
      <Field
        label="Address"
        hint="Optional. Street and number, so a collection volunteer can find you."
        error={errors.addressText}
      >
        <Input
          value={addressText}
          onChange={(e) => setAddressText(e.target.value)}
          autoComplete="street-address"
          maxLength={200}
        />
      </Field>
      <LocationPicker
        value={location}
        onChange={setLocation}
        streets={streets}
        onStreetPicked={(street) => {
          // Fill an empty address with the street, and follow the list while the person moves through it.
          const previous = autoStreet.current;
          autoStreet.current = street;
          setAddressText((current) => (current.trim() === "" || current === previous ? street : current));
        }}
        errors={errors}
      />
      <Field
        label="Scraps a week (kg, optional)"
        hint="A rough guess helps your coordinator share households between digesters. A full 10-litre bucket is about 5 kg."
        error={errors.declaredWeeklyKg}
      >
        <Input
          inputMode="decimal"
          autoComplete="off"
          value={weekly}
          onChange={(e) => setWeekly(e.target.value)}
          className="max-w-40"
        />
      </Field>
      <div>
        <Button type="submit" size="lg" loading={pending}>
          {editing ? "Save changes" : "Register household"}
        </Button>
      </div>
    </form>
  );
}
