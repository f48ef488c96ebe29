"use client";
/** The lift form's grouped fields: geometry, chain (catalogue pick or typed values), drive, take-up, ARD, check limits. */
import { Select } from "@/components/ui/Field";
import { NumberInput } from "@/components/ui/NumberInput";
import { CheckField, Section } from "@/components/ui/FormSection";
import type { SchemaForm } from "@/components/ui/useSchemaForm";
import { useList } from "@/lib/client/hooks";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { getPath, setPath, type FieldDef } from "@/components/ui/form-draft";
import { ARD_FIELDS, CHAIN_ROUTING_FIELDS, CHAIN_VALUE_FIELDS, DRIVE_FIELDS, EXTENT_FIELDS, GEOMETRY_FIELDS, LIMIT_FIELDS, TAKEUP_FIELDS } from "./fields";
import { ProfileSection } from "./ProfileSection";
import type { ChainSpecJson } from "./types";

export function LiftFormSections({ form, units, disabled }: { form: SchemaForm; units: UnitSystem; disabled: boolean }) {
  const { draft, setDraft, set, shown } = form;
  const specs = useList<ChainSpecJson>("/api/chain-specs", { pageSize: 100, sort: "pitch", order: "asc" });
  const field = (def: FieldDef, extraDisabled = false) => (
    <NumberInput
      key={`${def.path}-${units}`}
      def={def}
      units={units}
      value={getPath(draft, def.path)}
      onChange={(v) => set(def.path, v)}
      error={shown(def.path)}
      disabled={disabled || extraDisabled}
    />
  );

  const spec = specs.data?.items.find((s) => s.id === draft.chainSpecId) ?? null;
  const pickSpec = (idText: string) => {
    const id = idText ? Number(idText) : null;
    const s = specs.data?.items.find((x) => x.id === id);
    setDraft((d) => {
      let n = setPath(d, "chainSpecId", id);
      if (s) for (const k of ["pitch", "massPerLength", "axialStiffness", "breakingStrength"] as const) n = setPath(n, `chain.${k}`, s[k]);
      return n;
    });
  };

  return (
    <>
      <ProfileSection form={form} units={units} disabled={disabled} parametric={GEOMETRY_FIELDS.map((f) => field(f))} extent={EXTENT_FIELDS.map((f) => field(f))} />

      <Section title="Chain" description="Pick a catalogue chain, or type the chain's own values.">
        <div className="col-span-2 sm:col-span-3">
          <label htmlFor="f-chainSpecId" className="mb-1 block text-[12.5px] font-semibold text-ink-800">
            Chain size
          </label>
          <Select id="f-chainSpecId" name="chainSpecId" className="h-9" value={draft.chainSpecId ? String(draft.chainSpecId) : ""} disabled={disabled} onChange={(e) => pickSpec(e.target.value)} data-testid="chain-spec-select">
            <option value="">Typed in (not from the catalogue)</option>
            {specs.data?.items.map((s) => (
              <option key={s.id} value={s.id}>
                {s.designation} · pitch {formatQuantity(s.pitch, "smallLength", units)} · breaking {formatQuantity(s.breakingStrength, "force", units)}
                {s.standard ? "" : " · own"}
              </option>
            ))}
          </Select>
          {shown("chain.chainSpecId") && <p className="mt-1 text-[12px] font-medium text-fail">{shown("chain.chainSpecId")}</p>}
          {spec && <p className="mt-1 text-[11.5px] text-steel-500">Source: {spec.source}</p>}
        </div>
        {CHAIN_VALUE_FIELDS.map((f) => field(f, !!draft.chainSpecId))}
        {CHAIN_ROUTING_FIELDS.map((f) => field(f))}
      </Section>

      <Section title="Drive">{DRIVE_FIELDS.map((f) => field(f))}</Section>
      <Section title="Take-up" description="Weighted 2:1 gravity take-up on the bottom run.">
        {TAKEUP_FIELDS.map((f) => field(f))}
      </Section>
      <Section title="Anti-rollback device (ARD)">
        <CheckField path="antiRollback.enabled" label="ARD fitted" value={getPath(draft, "antiRollback.enabled") !== false} disabled={disabled} onChange={(v) => set("antiRollback.enabled", v)} />
        {ARD_FIELDS.map((f) => field(f))}
      </Section>
      <Section title="Check limits" description="Defaults name their source or say they are an assumption; change them for this lift.">
        {LIMIT_FIELDS.map((f) => field(f))}
        <CheckField
          path="limits.allowRollback"
          label="Allow settling back onto the ARD"
          value={getPath(draft, "limits.allowRollback") === true}
          disabled={disabled}
          onChange={(v) => set("limits.allowRollback", v)}
        />
      </Section>
    </>
  );
}
