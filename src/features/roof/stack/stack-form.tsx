/**
 * The layers of one stack, each a small group of fields with the trade's choices. One react-hook-form
 * form validated with the shared stack schema (zodResolver); every valid change is written into the
 * shared roof draft at once (the Roof sketch sees it), and a change made elsewhere (undo, the sketch)
 * resets the fields. Empty number fields take the schema's or the price book's default, shown as the
 * placeholder.
 */
import { useEffect, useRef, type ReactNode } from "react";
import { useForm, type FieldPath, type UseFormRegister } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import type { Advisory } from "@shared/engine/advisory";
import { MAT_DEFAULTS } from "@shared/engine/ventilation/channel";
import { LUMBER_NOMINALS, stackSchema, type Rules } from "@shared/schemas/takeoff";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";
import { cn } from "@/lib/cn";
import { roofDraftStore, type DraftStack } from "../api/roof-draft";
import { AdvisoryNote } from "./advisory-note";
import { LAYER_TITLES, type Layer, type StackAdvisories } from "./layer-advisories";
import { completeStack, type Stack } from "./model";

type FormIn = z.input<typeof stackSchema>;
type Name = FieldPath<FormIn>;

const num = (v: unknown) => (v === "" || v === null || v === undefined ? undefined : Number(v));
const bool = (v: unknown) => (v === "" || v === undefined ? undefined : v === true || v === "true");

/** Errors by dotted path (react-hook-form keeps them nested). */
function errorAt(errors: unknown, name: string): string | undefined {
  let cur: unknown = errors;
  for (const part of name.split(".")) {
    if (!cur || typeof cur !== "object") return undefined;
    cur = (cur as Record<string, unknown>)[part];
  }
  const m = cur && typeof cur === "object" ? (cur as { message?: unknown }).message : undefined;
  return typeof m === "string" ? m : undefined;
}

interface Props {
  jobId: number;
  stack: DraftStack;
  rules: Rules;
  advisories: StackAdvisories;
}

export function StackForm({ jobId, stack, rules, advisories }: Props) {
  const complete = completeStack(stack);
  const initial = (complete ?? stack) as FormIn;
  const form = useForm<FormIn, unknown, Stack>({ resolver: zodResolver(stackSchema), defaultValues: initial, mode: "onChange" });
  const { register, watch, formState, trigger, getValues, reset } = form;
  const lastWritten = useRef(JSON.stringify(complete));
  const lastEdit = useRef<{ name: string; at: number } | null>(null);

  // A change made elsewhere (undo, redo, the sketch, a reload) resets the fields.
  useEffect(() => {
    const c = completeStack(stack);
    const s = JSON.stringify(c);
    if (s !== lastWritten.current) {
      lastWritten.current = s;
      reset((c ?? stack) as FormIn);
    }
  }, [stack, reset]);

  // Every valid change goes into the draft; quick edits of one field make one undo step.
  useEffect(() => {
    const sub = watch((_values, { name }) => {
      if (!name) return;
      void trigger().then(() => {
        const parsed = stackSchema.safeParse(getValues());
        if (!parsed.success) return;
        const s = JSON.stringify(parsed.data);
        if (s === lastWritten.current) return;
        lastWritten.current = s;
        const now = Date.now();
        const coalesce = lastEdit.current?.name === name && now - lastEdit.current.at < 1500;
        lastEdit.current = { name, at: now };
        roofDraftStore.update(
          jobId,
          (doc) => ({ ...doc, stacks: doc.stacks.map((x) => (x.id === stack.id ? parsed.data : x)) }),
          { coalesce },
        );
      });
    });
    return () => sub.unsubscribe();
  }, [watch, trigger, getValues, jobId, stack.id]);

  const v = watch();
  const errors = formState.errors;
  const f = { register, errors };

  const spacerKind = v.spacer?.kind ?? "none";
  const battensOn = spacerKind === "battens";
  const mat = spacerKind === "mesh" || spacerKind === "dimpled" ? MAT_DEFAULTS[spacerKind] : null;
  const standingSeam = (v.panel?.system ?? "standing-seam") === "standing-seam";
  const foil = v.radiantBarrier?.kind === "foil";

  return (
    <form
      noValidate
      onSubmit={(e) => e.preventDefault()}
      aria-label={`Layers of ${stack.name || stack.id}`}
      className="grid gap-3 md:grid-cols-2"
    >
      <LayerCard layer="deck" advisories={advisories.byLayer.deck} step={1}>
        <SelectField f={f} name="deck.action" label="Existing deck">
          <option value="keep">Keep</option>
          <option value="repair">Repair a share</option>
          <option value="replace">Replace</option>
        </SelectField>
        {v.deck?.action === "repair" && <NumField f={f} name="deck.repairSharePct" label="Sheets to replace (%)" />}
        <SelectField f={f} name="deck.material" label="Material">
          <option value="plywood">Plywood</option>
          <option value="osb">OSB</option>
        </SelectField>
        <SelectField f={f} name="deck.thicknessIn" label="Thickness" asNumber>
          {[0.375, 0.4375, 0.5, 0.625, 0.75].map((t) => (
            <option key={t} value={t}>
              {{ 0.375: "3/8 in", 0.4375: "7/16 in", 0.5: "1/2 in", 0.625: "5/8 in", 0.75: "3/4 in" }[t]}
            </option>
          ))}
        </SelectField>
      </LayerCard>

      <LayerCard layer="underlayment" advisories={advisories.byLayer.underlayment} step={2}>
        <SelectField f={f} name="underlayment.kind" label="Underlayment">
          <option value="self-adhered">Self-adhered membrane</option>
          <option value="synthetic">Synthetic</option>
          <option value="felt">Felt</option>
        </SelectField>
        {v.underlayment?.kind === "felt" ? (
          <SelectField f={f} name="underlayment.feltNumber" label="Felt" asNumber>
            <option value={30}>No. 30</option>
            <option value={15}>No. 15</option>
          </SelectField>
        ) : (
          <CheckField f={f} name="underlayment.highTemp" label="High-temperature rated" hint="Metal panels run hot" />
        )}
        <SelectField f={f} name="underlayment.layers" label="Layers" asNumber>
          <option value={1}>1</option>
          <option value={2}>2</option>
        </SelectField>
        <SelectField f={f} name="underlayment.iceBarrier" label="Ice barrier at the eaves" asBool emptyLabel="Per site risk">
          <option value="true">Yes</option>
          <option value="false">No</option>
        </SelectField>
      </LayerCard>

      <LayerCard layer="spacer" advisories={advisories.byLayer.spacer} step={3}>
        <SelectField f={f} name="spacer.kind" label="Spacer">
          <option value="none">None</option>
          <option value="battens">Wood battens</option>
          <option value="mesh">3D mesh mat</option>
          <option value="dimpled">Dimpled sheet</option>
        </SelectField>
        {battensOn && (
          <>
            <SelectField f={f} name="spacer.battens.nominal" label="Batten size">
              {LUMBER_NOMINALS.map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </SelectField>
            <NumField f={f} name="spacer.battens.spacingIn" label="Batten spacing (in o.c.)" />
            <CheckField f={f} name="spacer.battens.treated" label="Preservative-treated" />
            <CheckField f={f} name="spacer.battens.counterBattens" label="Counter-battens under them" hint="Run up the slope: keeps the air path open" />
            {v.spacer?.battens?.counterBattens && (
              <>
                <SelectField f={f} name="spacer.battens.counterBattenNominal" label="Counter-batten size" emptyLabel="Same as battens">
                  {LUMBER_NOMINALS.map((n) => (
                    <option key={n} value={n}>
                      {n}
                    </option>
                  ))}
                </SelectField>
                <NumField
                  f={f}
                  name="spacer.battens.counterBattenSpacingIn"
                  label="Counter-batten spacing (in o.c.)"
                  placeholder={String(rules.battens.counterBattenSpacingIn)}
                />
              </>
            )}
          </>
        )}
        {mat && (
          <>
            <NumField f={f} name="spacer.thicknessIn" label="Thickness (in)" step="0.05" placeholder={String(mat.thicknessIn)} hint="From the maker's data" />
            <NumField f={f} name="spacer.openFraction" label="Open fraction (0–1)" step="0.05" placeholder={String(mat.openFraction)} hint="Share of the channel open to air" />
          </>
        )}
      </LayerCard>

      <LayerCard layer="radiantBarrier" advisories={advisories.byLayer.radiantBarrier} step={4}>
        <SelectField f={f} name="radiantBarrier.kind" label="Radiant barrier">
          <option value="none">None</option>
          <option value="foil">Reflective foil</option>
        </SelectField>
        {foil && (
          <>
            <SelectField f={f} name="radiantBarrier.position" label="Laid">
              <option value="on-deck">On the deck</option>
              <option value="under-panels">Under the panels</option>
            </SelectField>
            <SelectField f={f} name="radiantBarrier.reflectiveFace" label="Reflective face">
              <option value="up">Up</option>
              <option value="down">Down</option>
            </SelectField>
            <NumField f={f} name="radiantBarrier.emittance" label="Foil emittance" step="0.01" hint="Bright foil 0.05; a radiant barrier is 0.1 or less" />
          </>
        )}
      </LayerCard>

      <LayerCard layer="panel" advisories={advisories.byLayer.panel} step={5}>
        <SelectField f={f} name="panel.system" label="System">
          <option value="standing-seam">Standing seam</option>
          <option value="exposed-fastener">Exposed fastener</option>
        </SelectField>
        <NumField f={f} name="panel.coverageWidthIn" label="Coverage width (in)" step="0.5" />
        <SelectField f={f} name="panel.gauge" label="Gauge" asNumber>
          {[22, 24, 26, 29].map((g) => (
            <option key={g} value={g}>
              {g} ga
            </option>
          ))}
        </SelectField>
        <SelectField f={f} name="panel.substrate" label="Metal">
          <option value="metallic-coated-steel">Coated steel</option>
          <option value="aluminum">Aluminum</option>
          <option value="copper">Copper</option>
          <option value="zinc">Zinc</option>
        </SelectField>
        <NumField f={f} name="panel.solarReflectance" label="Solar reflectance (0–1)" step="0.01" hint="Finish's rated initial value" />
        <NumField f={f} name="panel.thermalEmittance" label="Thermal emittance (0–1)" step="0.01" />
        <NumField f={f} name="panel.panelUndersideEmittance" label="Underside emittance" step="0.01" hint="Painted or bare back: 0.90" />
        <NumField f={f} name="panel.minPitch" label="Maker's minimum pitch (in 12)" step="0.25" placeholder="not given" />
        {!standingSeam && (
          <CheckField f={f} name="panel.lapSealant" label="Applied lap sealant" hint="Lets lapped panels go below 3:12 (to 1/2:12)" />
        )}
        <NumField f={f} name="panel.hemAllowanceIn" label="Hem allowance (in)" step="0.25" placeholder={String(rules.panels.hemAllowanceIn)} />
        {standingSeam ? (
          <fieldset className="col-span-full grid grid-cols-3 gap-2">
            <legend className="mb-1 text-xs font-medium text-steel-700">Clip spacing (in) by wind zone</legend>
            <NumField f={f} name="panel.clipSpacingIn.field" label="Field (1)" placeholder={String(rules.clips.spacingIn.field)} />
            <NumField f={f} name="panel.clipSpacingIn.edge" label="Edge (2)" placeholder={String(rules.clips.spacingIn.edge)} />
            <NumField f={f} name="panel.clipSpacingIn.corner" label="Corner (3)" placeholder={String(rules.clips.spacingIn.corner)} />
          </fieldset>
        ) : (
          <fieldset className="col-span-full grid grid-cols-3 gap-2">
            <legend className="mb-1 text-xs font-medium text-steel-700">Screws per square by wind zone</legend>
            <NumField f={f} name="panel.screwsPerSquare.field" label="Field (1)" placeholder={String(rules.exposedFastener.screwsPerSquare.field)} />
            <NumField f={f} name="panel.screwsPerSquare.edge" label="Edge (2)" placeholder={String(rules.exposedFastener.screwsPerSquare.edge)} />
            <NumField f={f} name="panel.screwsPerSquare.corner" label="Corner (3)" placeholder={String(rules.exposedFastener.screwsPerSquare.corner)} />
          </fieldset>
        )}
        <SelectField f={f} name="panel.start" label="First panel at">
          <option value="left">Left (from eave)</option>
          <option value="right">Right</option>
          <option value="centred">Centred</option>
        </SelectField>
        <NumField f={f} name="panel.maxLengthFt" label="Longest panel (ft)" placeholder={String(rules.panels.maxLengthFt)} hint="Shipping limit" />
      </LayerCard>

      <LayerCard layer="ventilation" advisories={advisories.byLayer.ventilation} step={6}>
        <NumField
          f={f}
          name="ventilation.intakeNfaPerFtSqIn"
          label="Intake vent NFA (in² per ft)"
          placeholder={String(rules.vents.intakeNfaPerFtSqIn)}
        />
        <NumField
          f={f}
          name="ventilation.exhaustNfaPerFtSqIn"
          label="Ridge vent NFA (in² per ft)"
          placeholder={String(rules.vents.ridgeNfaPerFtSqIn)}
        />
        <CheckField f={f} name="ventilation.eaveOpen" label="Gap open at the eave" hint="Vented eave closure or open starter" />
        <CheckField f={f} name="ventilation.topOpen" label="Gap open at the top" hint="Vented ridge or head closure" />
        <CheckField f={f} name="ventilation.ventHips" label="Vented hip caps" />
        <CheckField f={f} name="ventilation.ventHeadwalls" label="Vented headwalls" />
        <CheckField
          f={f}
          name="ventilation.aboveDeckClaimed"
          label="Counting on the above-deck channel"
          hint="The channel must then qualify (≥ 3/4 in, open both ends)"
        />
      </LayerCard>

      {advisories.other.length > 0 && (
        <section className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel md:col-span-2" aria-label="Other findings for these planes">
          <h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-steel-600">Other findings for these planes</h3>
          <ul className="space-y-1.5">
            {advisories.other.map((a, i) => (
              <AdvisoryNote key={a.code + i} advisory={a} />
            ))}
          </ul>
        </section>
      )}
    </form>
  );
}

// ---- field helpers -------------------------------------------------------------------------------

type F = { register: UseFormRegister<FormIn>; errors: unknown };

function LayerCard({ layer, step, advisories, children }: { layer: Layer; step: number; advisories: Advisory[]; children: ReactNode }) {
  const worst = advisories[0]?.severity;
  return (
    <fieldset
      className={cn(
        "min-w-0 rounded-lg border bg-white p-3 shadow-panel",
        worst === "error" ? "border-danger-200" : worst === "warning" ? "border-caution-200" : "border-steel-200",
      )}
      data-layer={layer}
    >
      <legend className="sr-only">{LAYER_TITLES[layer]}</legend>
      <div className="mb-2 flex items-center gap-2" aria-hidden="true">
        <span className="flex size-5 items-center justify-center rounded-full bg-steel-100 text-[11px] font-semibold text-steel-600">{step}</span>
        <h3 className="text-sm font-semibold text-steel-900">{LAYER_TITLES[layer]}</h3>
        {advisories.length > 0 && (
          <span className="ml-auto text-xs text-steel-500">
            {advisories.length} {advisories.length === 1 ? "finding" : "findings"}
          </span>
        )}
      </div>
      <div className="grid grid-cols-2 gap-x-3 gap-y-2 lg:grid-cols-3">{children}</div>
      {advisories.length > 0 && (
        <ul className="mt-3 space-y-1.5" aria-label={`${LAYER_TITLES[layer]} findings`}>
          {advisories.map((a, i) => (
            <AdvisoryNote key={a.code + i} advisory={a} />
          ))}
        </ul>
      )}
    </fieldset>
  );
}

function NumField({
  f,
  name,
  label,
  hint,
  placeholder,
  step = "any",
}: {
  f: F;
  name: Name;
  label: string;
  hint?: string;
  placeholder?: string;
  step?: string;
}) {
  return (
    <Field label={label} hint={hint} error={errorAt(f.errors, name)}>
      <Input type="number" inputMode="decimal" step={step} placeholder={placeholder} {...f.register(name, { setValueAs: num })} />
    </Field>
  );
}

function SelectField({
  f,
  name,
  label,
  children,
  asNumber,
  asBool,
  emptyLabel,
}: {
  f: F;
  name: Name;
  label: string;
  children: ReactNode;
  asNumber?: boolean;
  asBool?: boolean;
  emptyLabel?: string;
}) {
  const setValueAs = asNumber ? num : asBool ? bool : emptyLabel ? (x: unknown) => (x === "" ? undefined : x) : undefined;
  return (
    <Field label={label} error={errorAt(f.errors, name)}>
      <Select {...f.register(name, setValueAs ? { setValueAs } : {})}>
        {emptyLabel && <option value="">{emptyLabel}</option>}
        {children}
      </Select>
    </Field>
  );
}

function CheckField({ f, name, label, hint }: { f: F; name: Name; label: string; hint?: string }) {
  return (
    <label className="col-span-full flex items-start gap-2 text-sm text-steel-800 sm:col-span-1">
      <input type="checkbox" className="mt-0.5 size-4 rounded border-steel-300 accent-accent-700" {...f.register(name)} />
      <span>
        {label}
        {hint && <span className="block text-xs text-steel-500">{hint}</span>}
      </span>
    </label>
  );
}
