/**
 * Jobs: the job form, POST/PATCH /api/jobs, the board's list query, the assignment body, and the status
 * rules the client uses to offer only the moves the server accepts.
 */
import { z } from "zod";
import { jobProposalProgressSchema } from "./proposal-api";
import { siteSchema } from "./takeoff";
import { archivedFlagSchema, customerInputSchema, optionalText, pagingShape } from "./customer";

export const JOB_STATUSES = ["lead", "estimating", "proposed", "won", "scheduled", "installed", "lost"] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

/**
 * Status moves a person makes by hand (PATCH /api/jobs/:id `status`), for owners and estimators.
 * The others happen by themselves: the first saved roof moves lead → estimating, a sent proposal
 * → proposed, an accepted one → won, a declined or expired one → lost.
 * - any open job can be marked lost (the homeowner went elsewhere);
 * - a won job is scheduled, a scheduled one installed;
 * - a scheduled job can go back to won (the date fell through), an installed one back to scheduled
 *   (marked installed by mistake);
 * - a lost job can be reopened as a lead or, when it has been measured, as estimating.
 */
export const MANUAL_STATUS_MOVES: Readonly<Record<JobStatus, readonly JobStatus[]>> = {
  lead: ["lost"],
  estimating: ["lost"],
  proposed: ["lost"],
  won: ["scheduled", "lost"],
  scheduled: ["installed", "won", "lost"],
  installed: ["scheduled"],
  lost: ["lead", "estimating"],
};

/** Whether a person may move a job from one status to another by hand (same status: nothing to do). */
export const canMoveJobStatus = (from: JobStatus, to: JobStatus): boolean =>
  from === to || MANUAL_STATUS_MOVES[from].includes(to);

/**
 * The engine's site object (attic, climate zone, ice-dam risk, wind, existing layers), stored per job.
 * Fields not given take the engine's defaults.
 */
export const jobSiteSchema = siteSchema;
export type JobSite = z.output<typeof jobSiteSchema>;

/** An object field that may be left out of a PATCH without its defaults filling in. */
const optionalSite = z.preprocess((v) => v, jobSiteSchema).optional();

const idSchema = (what: string) =>
  z.coerce.number({ error: `Pick ${what}` }).int(`Pick ${what}`).positive(`Pick ${what}`).max(4294967295, `Pick ${what}`);

const siteAddressShape = {
  siteAddressLine1: optionalText(160),
  siteAddressLine2: optionalText(160),
  siteCity: optionalText(80),
  siteRegion: optionalText(80),
  sitePostalCode: optionalText(20),
};

/**
 * POST /api/jobs. The customer is picked (`customerId`) or created with the job (`customer`), never both.
 * A site address left out entirely is copied from the customer's address. A new job starts as a lead.
 */
export const jobInputSchema = z
  .object({
    customerId: idSchema("a customer").optional(),
    customer: customerInputSchema.optional(),
    ...siteAddressShape,
    site: optionalSite,
    notes: optionalText(5000),
    /** Defaults to the signed-in user when they are an estimator. */
    estimatorId: idSchema("an estimator").nullish(),
  })
  .superRefine((v, ctx) => {
    if (v.customerId === undefined && v.customer === undefined) {
      ctx.addIssue({ code: "custom", path: ["customerId"], message: "Pick a customer or add a new one" });
    }
    if (v.customerId !== undefined && v.customer !== undefined) {
      ctx.addIssue({ code: "custom", path: ["customer"], message: "Pick a customer or add a new one, not both" });
    }
  });
export type JobInput = z.output<typeof jobInputSchema>;
export type JobFormValues = z.input<typeof jobInputSchema>;

/** PATCH /api/jobs/:id: any of these, at least one. `site` replaces the stored site as a whole. */
export const jobUpdateSchema = z
  .object({
    customerId: idSchema("a customer").optional(),
    siteAddressLine1: optionalText(160).optional(),
    siteAddressLine2: optionalText(160).optional(),
    siteCity: optionalText(80).optional(),
    siteRegion: optionalText(80).optional(),
    sitePostalCode: optionalText(20).optional(),
    site: optionalSite,
    notes: optionalText(5000).optional(),
    status: z.enum(JOB_STATUSES, { error: "Pick a status" }).optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: "Nothing to change" });
export type JobUpdate = z.output<typeof jobUpdateSchema>;

/** PUT /api/jobs/:id/assignment: the estimator (an estimator or owner) and the crew (crew members). */
export const jobAssignmentSchema = z.object({
  estimatorId: idSchema("an estimator").nullable(),
  crewIds: z
    .array(idSchema("a crew member"), { error: "Required" })
    .max(50, "At most 50 crew members")
    .refine((ids) => new Set(ids).size === ids.length, { message: "A crew member is listed twice" }),
});
export type JobAssignment = z.output<typeof jobAssignmentSchema>;

export const JOB_SORTS = [
  "updatedAt",
  "-updatedAt",
  "createdAt",
  "-createdAt",
  "customer",
  "-customer",
  "status",
  "-status",
  "squares",
  "-squares",
  "quoteTotal",
  "-quoteTotal",
] as const;
export type JobSort = (typeof JOB_SORTS)[number];

/** GET /api/jobs: `status` may list several (`status=won,scheduled`); `estimatorId=none` finds unassigned jobs. */
export const jobListQuerySchema = z.object({
  ...pagingShape,
  status: z
    .string()
    .trim()
    .transform((s) => s.split(",").map((x) => x.trim()).filter(Boolean))
    .pipe(z.array(z.enum(JOB_STATUSES, { error: `Use ${JOB_STATUSES.join(", ")}` })).max(JOB_STATUSES.length))
    .optional(),
  estimatorId: z.union([z.literal("none"), idSchema("an estimator")], { error: 'Use an estimator id or "none"' }).optional(),
  customerId: idSchema("a customer").optional(),
  /** Matches the customer's name or e-mail, or the site's street, city or postal code. */
  q: z.string().trim().max(120, "Use at most 120 characters").optional(),
  sort: z.enum(JOB_SORTS, { error: `Use one of ${JOB_SORTS.join(", ")}` }).default("-updatedAt"),
  archived: archivedFlagSchema,
});
export type JobListQuery = z.output<typeof jobListQuerySchema>;
export type JobListParams = z.input<typeof jobListQuerySchema>;

const personSchema = z.object({ id: z.number().int(), name: z.string() });

/** A job as GET /api/jobs/:id returns it. `quoteTotalCents` is left out (the key, not only the value) for crew. */
export const jobDtoSchema = z.object({
  id: z.number().int(),
  status: z.enum(JOB_STATUSES),
  customerId: z.number().int(),
  customer: z.object({
    id: z.number().int(),
    name: z.string(),
    email: z.string().nullable(),
    phone: z.string().nullable(),
  }),
  siteAddressLine1: z.string().nullable(),
  siteAddressLine2: z.string().nullable(),
  siteCity: z.string().nullable(),
  siteRegion: z.string().nullable(),
  sitePostalCode: z.string().nullable(),
  site: jobSiteSchema,
  notes: z.string().nullable(),
  estimatorId: z.number().int().nullable(),
  estimator: personSchema.nullable(),
  crew: z.array(personSchema),
  /** From the stored takeoff; null until a roof is saved. */
  squares: z.number().nullable(),
  quoteTotalCents: z.number().int().nullable().optional(),
  /** The latest proposal's progress (sent, viewed, accepted/declined, deposit); null before one is sent. */
  proposal: jobProposalProgressSchema.nullable().optional(),
  archivedAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type JobDto = z.infer<typeof jobDtoSchema>;

/** A row of the jobs board. `quoteTotalCents` is left out for crew. */
export const jobListItemSchema = jobDtoSchema
  .pick({
    id: true,
    status: true,
    customerId: true,
    siteAddressLine1: true,
    siteCity: true,
    estimatorId: true,
    squares: true,
    quoteTotalCents: true,
    proposal: true,
    archivedAt: true,
    createdAt: true,
    updatedAt: true,
  })
  .extend({ customer: personSchema, estimator: personSchema.nullable() });
export type JobListItem = z.infer<typeof jobListItemSchema>;
