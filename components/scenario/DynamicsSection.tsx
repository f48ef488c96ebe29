"use client";
/**
 * The scenario editor's drive model and damping: motor kind and its fields, drive location, stop event,
 * take-up friction and damping, chain damping and loss factor, contact stiffness and damping. A field left
 * empty takes the pinned lift revision's value (shown under it) or the format's default.
 */
import { Select } from "@/components/ui/Field";
import { NumberInput, fieldId } from "@/components/ui/NumberInput";
import { Section } from "@/components/ui/FormSection";
import { getPath, type Draft, type FieldDef } from "@/components/ui/form-draft";
import { formatQuantity, unitOf, type UnitSystem } from "@/lib/client/units";
import type { Scenario } from "@/sim";
import {
  CHAIN_DAMPING_FIELDS,
  CONTACT_FIELDS,
  INDUCTION_FIELDS,
  MOTOR_KINDS,
  SPEED_LOOP_FIELDS,
  STOP_FIELDS,
  RESTART_FIELD,
  ELONGATION_FIELD,
  LINKS_REMOVED_FIELD,
  TAKEUP_DAMPING_FIELDS,
  type MotorKind,
} from "./dynamics-fields";

const LOCATIONS = [
  { value: "bottom", label: "Bottom (foot of the return strand)", help: "Format 1 routing: the drive pulls the return strand at the foot of the lift." },
  { value: "top", label: "Top (crest end of the carrying strand)", help: "The drive sprocket sits at the crest: the carrying strand from the dog to the top is the tight side." },
] as const;

const STOPS = [
  { value: "brake", label: "Brake stop", help: "At the stop time the chain speed goes to zero over the duration and is held." },
  { value: "power-loss", label: "Power loss", help: "At the stop time the motor's pull drops to zero; the brake holds the sprocket after the duration." },
] as const;

interface Props {
  draft: Draft;
  set: (path: string, value: unknown) => void;
  shown: (path: string) => string | undefined;
  units: UnitSystem;
  disabled: boolean;
  /** The scenario as the engine runs it now (revision + dynamics + defaults), for "now" read-outs; null for a new scenario. */
  engine: Scenario | null;
}

/** The engine value behind a dynamics path (e.g. dynamics.takeUp.friction → takeUp.friction). */
const enginePath = (p: string) => p.replace(/^dynamics\./, "");

/** A field's message with its label and unit, so it reads alone (in the banner or beside the field). */
export function labelledError(def: FieldDef, units: UnitSystem, message: string | undefined): string | undefined {
  if (!message) return undefined;
  // Messages in words already start with the field's label; only a bare message gets it in front.
  if (message.startsWith(def.label)) return message;
  const unit = unitOf(def.q, units).label;
  return `${def.label}${unit ? ` (${unit})` : ""}: ${message}`;
}

export function DynamicsSection({ draft, set, shown, units, disabled, engine }: Props) {
  const motor = getPath(draft, "dynamics.drive.motor") as { kind?: MotorKind } | undefined;
  const kind = motor?.kind;
  const engineMotor = engine ? (getPath(engine, "drive.motor") as { kind?: MotorKind } | undefined) : undefined;
  const shownKind = kind ?? engineMotor?.kind;
  const location = getPath(draft, "dynamics.drive.location") as string | undefined;
  const stop = getPath(draft, "dynamics.drive.stop") as { kind?: string } | undefined;

  const field = (def: FieldDef) => {
    const now = engine ? getPath(engine, enginePath(def.path)) : undefined;
    const own = getPath(draft, def.path);
    const hint = own === undefined && typeof now === "number" ? `${def.hint ?? ""} Now: ${formatQuantity(now, def.q, units)} (lift revision or default).` : def.hint;
    return (
      <NumberInput
        key={`${def.path}-${units}`}
        def={{ ...def, hint }}
        units={units}
        value={own}
        // An empty restart time removes the restart (the section has no other field).
        onChange={(v) => (def === RESTART_FIELD && v === undefined ? set("dynamics.drive.restart", undefined) : set(def.path, v))}
        error={labelledError(def, units, shown(def.path))}
        disabled={disabled}
      />
    );
  };
  const selectBlock = (path: string, label: string, value: string, onChange: (v: string) => void, options: { value: string; label: string }[], help: string, testId: string) => {
    const id = fieldId(path);
    const err = shown(path);
    return (
      <div className="min-w-0">
        <label htmlFor={id} className="mb-1 block text-[12.5px] font-semibold text-ink-800">{label}</label>
        <Select id={id} className="h-9" value={value} disabled={disabled} onChange={(e) => onChange(e.target.value)} data-testid={testId}>
          {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
        </Select>
        {err ? (
          <p data-testid={`error-${path}`} className="mt-1 text-[12px] font-medium text-fail">{label}: {err}</p>
        ) : (
          <p className="mt-1 text-[11.5px] leading-snug text-steel-500">{help}</p>
        )}
      </div>
    );
  };

  const kindHelp = MOTOR_KINDS.find((m) => m.kind === shownKind)?.help ?? "";
  const motorFields = kind === "induction" ? INDUCTION_FIELDS : kind === "speed-loop" ? SPEED_LOOP_FIELDS : [];
  const revisionLabel = (what: string | undefined) => `As the lift revision${what ? ` (${what})` : ""}`;
  return (
    <div className="space-y-4" data-testid="dynamics-section">
      <Section
        title="Drive model"
        description="How the drive holds the chain speed. Empty choices and fields take the pinned lift revision's values or the format's defaults."
      >
        {selectBlock(
          "dynamics.drive.motor",
          "Drive model",
          kind ?? "",
          (v) => {
            const reflectedMass = (motor as Record<string, unknown> | undefined)?.reflectedMass;
            if (!v) set("dynamics.drive.motor", undefined);
            else if (v === "ideal") set("dynamics.drive.motor", { kind: "ideal" });
            else set("dynamics.drive.motor", { kind: v, ...(reflectedMass !== undefined ? { reflectedMass } : {}) });
          },
          [{ value: "", label: revisionLabel(MOTOR_KINDS.find((m) => m.kind === engineMotor?.kind)?.label) }, ...MOTOR_KINDS.map((m) => ({ value: m.kind, label: m.label }))],
          kindHelp,
          "drive-model",
        )}
        {selectBlock(
          "dynamics.drive.location",
          "Drive location",
          location ?? "",
          (v) => set("dynamics.drive.location", v || undefined),
          [{ value: "", label: revisionLabel(engine ? String(getPath(engine, "drive.location") ?? "") : undefined) }, ...LOCATIONS.map((l) => ({ value: l.value, label: l.label }))],
          LOCATIONS.find((l) => l.value === (location ?? getPath(engine, "drive.location")))?.help ?? LOCATIONS[0].help,
          "drive-location",
        )}
        {selectBlock(
          "dynamics.drive.stop",
          "Stop event",
          stop?.kind ?? "",
          (v) => {
            set("dynamics.drive.stop", v ? { ...(stop ?? {}), kind: v } : undefined);
            // A restart needs a stop before it.
            if (!v) set("dynamics.drive.restart", undefined);
          },
          [{ value: "", label: "None (the drive runs to the end)" }, ...STOPS.map((s) => ({ value: s.value, label: s.label }))],
          STOPS.find((s) => s.value === stop?.kind)?.help ?? "Optional: stop the drive during the run to see the train settle onto the chain or roll back onto the ARD.",
          "drive-stop",
        )}
        {motorFields.map(field)}
        {stop?.kind ? [...STOP_FIELDS, RESTART_FIELD].map(field) : null}
      </Section>
      <Section title="Chain wear" description="The chain as it is today: its elongation (pitch growth) lengthens the loop and lowers the take-up.">
        {field(ELONGATION_FIELD)}
        {field(LINKS_REMOVED_FIELD)}
      </Section>
      <Section
        title="Damping and contacts"
        description="Where the lift loses energy after the pick-up (the surge of the train on the chain), and how stiff its steel contacts are."
      >
        {[...TAKEUP_DAMPING_FIELDS, ...CHAIN_DAMPING_FIELDS, ...CONTACT_FIELDS].map(field)}
      </Section>
    </div>
  );
}
