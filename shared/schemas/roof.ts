/**
 * The roof document of a job: the planes, the layer stacks, the stack for planes without one, and an
 * optional plan underlay (a drawing or photo traced over), saved as one document with a version.
 *
 * GET /api/jobs/:id/roof returns `{ planes, stacks, defaultStackId, version, underlay? }`; a job whose
 * roof was never saved answers version 0 with empty planes and stacks and defaultStackId "".
 * PUT /api/jobs/:id/roof takes `roofSaveSchema`: `version` is the version the client loaded (0 for the
 * first save); an accepted save returns version + 1, any other version is refused with 409.
 * `underlay` left out keeps the stored one; `underlay: null` removes it.
 */
import { z } from "zod";
import { checkRoofShape, MAX_ID_LENGTH, planesSchema, stacksSchema } from "./takeoff";

/**
 * A plan image placed under the sketch, in plan feet. `src` is a path on this server (an uploaded file);
 * for a PDF, `page` picks the page. The image's lower-left corner is at `originFt`, it is `widthFt` wide
 * (its height follows its aspect ratio) and turned `rotationDeg` counter-clockwise about that corner.
 */
export const underlaySchema = z.object({
  src: z
    .string({ error: "Required" })
    .trim()
    .min(1, "Required")
    .max(500, "Use at most 500 characters")
    .regex(/^\/(?!\/)[^\s]*$/, "Use a path on this server, such as /api/files/123"),
  /** Plan position (ft) of the image's lower-left corner. */
  originFt: z.tuple([z.number({ error: "Enter a number" }), z.number({ error: "Enter a number" })]).default([0, 0]),
  /** Width of the image in plan feet (sets the scale); the height follows the image's aspect ratio. */
  widthFt: z.number({ error: "Enter a number" }).positive("Must be more than 0").max(10_000, "At most 10000 ft"),
  rotationDeg: z.number({ error: "Enter a number" }).min(-360, "At least -360").max(360, "At most 360").default(0),
  opacity: z.number({ error: "Enter a number" }).min(0, "At least 0").max(1, "At most 1").default(0.5),
  visible: z.boolean().default(true),
  /** The page shown when `src` is a PDF; left out means 1 (and an image has only that one). */
  page: z.number({ error: "Enter a number" }).int("Must be a whole number").min(1, "At least 1").max(10_000, "At most 10000").optional(),
});
export type Underlay = z.output<typeof underlaySchema>;

export const roofDocumentShape = {
  planes: planesSchema,
  stacks: stacksSchema,
  defaultStackId: z.string({ error: "Required" }).min(1, "Required").max(MAX_ID_LENGTH, `Use at most ${MAX_ID_LENGTH} characters`),
};

/**
 * The body of PUT /api/jobs/:id/roof. Besides each field's own checks it runs the takeoff input's
 * cross-checks (duplicate ids, unknown stacks, eave edge in range, outlines that cross themselves or
 * have no area), so the form and the route report the same field paths.
 */
export const roofSaveSchema = z
  .object({
    ...roofDocumentShape,
    version: z.number({ error: "Required" }).int("Must be a whole number").min(0, "Must be 0 or more"),
    underlay: underlaySchema.nullable().optional(),
  })
  // The takeoff input's cross-checks, on the planes and stacks parsed above (not parsed a second time).
  .superRefine(checkRoofShape);
export type RoofSave = z.output<typeof roofSaveSchema>;
export type RoofSaveValues = z.input<typeof roofSaveSchema>;

/** The stored roof document (what a save keeps, without its version). */
export type RoofDocument = Pick<RoofSave, "planes" | "stacks" | "defaultStackId"> & { underlay?: Underlay };

/** GET /api/jobs/:id/roof. */
export interface RoofDto extends RoofDocument {
  version: number;
}
