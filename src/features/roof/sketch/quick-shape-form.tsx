/**
 * Quick shapes from the engine's generators: gable, hip, shed or an L-shaped gable on a rectangle of the
 * given size, pitch and position (lower-left corner, plan feet).
 */
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { gableRoof, hipRoof, lShapeGableRoof, shedRoof, type GeneratedPlane } from "@shared/engine/roof/generators";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";

const size = z.number({ error: "Enter a number" }).positive("Must be more than 0").max(1000, "At most 1000 ft");
const coord = z.number({ error: "Enter a number" }).min(-10_000).max(10_000);

export const quickShapeSchema = z
  .object({
    shape: z.enum(["gable", "hip", "shed", "l-shape"]),
    widthFt: size,
    depthFt: size,
    pitch: z.number({ error: "Enter a number" }).min(0, "0 to 24").max(24, "0 to 24"),
    x: coord,
    y: coord,
    ridgeAlong: z.enum(["x", "y"]),
    wingWidthFt: size,
    wingDepthFt: size,
    wingOffsetFt: z.number({ error: "Enter a number" }).min(0),
  })
  .superRefine((v, ctx) => {
    if (v.shape !== "l-shape") return;
    if (v.wingWidthFt > v.depthFt) ctx.addIssue({ code: "custom", path: ["wingWidthFt"], message: "No wider than the main block is deep" });
    if (v.wingOffsetFt <= 0 || v.wingOffsetFt + v.wingWidthFt >= v.widthFt)
      ctx.addIssue({ code: "custom", path: ["wingOffsetFt"], message: "The wing must sit inside the main eave" });
  });
export type QuickShape = z.output<typeof quickShapeSchema>;

export const QUICK_SHAPE_DEFAULTS: QuickShape = {
  shape: "gable",
  widthFt: 40,
  depthFt: 28,
  pitch: 6,
  x: 0,
  y: 0,
  ridgeAlong: "x",
  wingWidthFt: 20,
  wingDepthFt: 16,
  wingOffsetFt: 8,
};

export function generateShape(v: QuickShape, idPrefix: string): GeneratedPlane[] {
  const opts = { idPrefix, origin: [v.x, v.y] as [number, number] };
  switch (v.shape) {
    case "gable":
      return gableRoof(v.widthFt, v.depthFt, v.pitch, { ...opts, ridgeAlong: v.ridgeAlong });
    case "hip":
      return hipRoof(v.widthFt, v.depthFt, v.pitch, opts);
    case "shed":
      return shedRoof(v.widthFt, v.depthFt, v.pitch, opts);
    case "l-shape":
      return lShapeGableRoof(
        { mainWidthFt: v.widthFt, mainDepthFt: v.depthFt, wingWidthFt: v.wingWidthFt, wingDepthFt: v.wingDepthFt, wingOffsetFt: v.wingOffsetFt },
        v.pitch,
        opts,
      );
  }
}

export function QuickShapeForm({ onAdd, onCancel }: { onAdd: (v: QuickShape) => string | null; onCancel: () => void }) {
  const {
    register,
    handleSubmit,
    watch,
    setError,
    formState: { errors },
  } = useForm<QuickShape>({ resolver: zodResolver(quickShapeSchema), defaultValues: QUICK_SHAPE_DEFAULTS });
  const shape = watch("shape");
  const num = { valueAsNumber: true } as const;
  const submit = handleSubmit((v) => {
    const problem = onAdd(v);
    if (problem) setError("root", { message: problem });
  });
  return (
    <form onSubmit={submit} className="space-y-3" noValidate>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Field label="Shape" className="col-span-2">
          <Select {...register("shape")} data-autofocus>
            <option value="gable">Gable (2 planes)</option>
            <option value="hip">Hip (4 planes)</option>
            <option value="shed">Shed (1 plane)</option>
            <option value="l-shape">L-shaped gable (4 planes)</option>
          </Select>
        </Field>
        <Field label="Pitch (rise in 12)" error={errors.pitch?.message}>
          <Input inputMode="decimal" {...register("pitch", num)} />
        </Field>
        {shape === "gable" ? (
          <Field label="Ridge runs">
            <Select {...register("ridgeAlong")}>
              <option value="x">East–west</option>
              <option value="y">North–south</option>
            </Select>
          </Field>
        ) : (
          <span />
        )}
        <Field label={shape === "l-shape" ? "Main width (ft)" : "Width, east–west (ft)"} error={errors.widthFt?.message}>
          <Input inputMode="decimal" {...register("widthFt", num)} />
        </Field>
        <Field label={shape === "l-shape" ? "Main depth (ft)" : "Depth, north–south (ft)"} error={errors.depthFt?.message}>
          <Input inputMode="decimal" {...register("depthFt", num)} />
        </Field>
        <Field label="Left edge x (ft)" error={errors.x?.message}>
          <Input inputMode="decimal" {...register("x", num)} />
        </Field>
        <Field label="Bottom edge y (ft)" error={errors.y?.message}>
          <Input inputMode="decimal" {...register("y", num)} />
        </Field>
        {shape === "l-shape" && (
          <>
            <Field label="Wing width (ft)" error={errors.wingWidthFt?.message}>
              <Input inputMode="decimal" {...register("wingWidthFt", num)} />
            </Field>
            <Field label="Wing length south (ft)" error={errors.wingDepthFt?.message}>
              <Input inputMode="decimal" {...register("wingDepthFt", num)} />
            </Field>
            <Field label="Wing from left (ft)" error={errors.wingOffsetFt?.message} className="col-span-2">
              <Input inputMode="decimal" {...register("wingOffsetFt", num)} />
            </Field>
          </>
        )}
      </div>
      {errors.root?.message && <p className="text-xs text-danger-700">{errors.root.message}</p>}
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit">Add planes</Button>
      </div>
    </form>
  );
}
