/**
 * Customers (homeowners): the customer form, POST/PATCH /api/customers and the list query.
 * Optional text fields accept "" from a form and store it as null.
 */
import { z } from "zod";

export const DEFAULT_PAGE_SIZE = 25;
export const MAX_PAGE_SIZE = 100;

/** `page` and `pageSize` of every list (pageSize 1–100, default 25). */
export const pagingShape = {
  page: z.coerce.number({ error: "Enter a page number" }).int("Must be a whole number").min(1, "Pages start at 1").default(1),
  pageSize: z.coerce
    .number({ error: "Enter a page size" })
    .int("Must be a whole number")
    .min(1, "At least 1")
    .max(MAX_PAGE_SIZE, `At most ${MAX_PAGE_SIZE}`)
    .default(DEFAULT_PAGE_SIZE),
};

/** `archived=1|true` lists archived records only; `0`, `false` or absent lists live ones. */
export const archivedFlagSchema = z
  .enum(["1", "0", "true", "false"], { error: "Use 1 or 0" })
  .transform((v) => v === "1" || v === "true")
  .optional();

/** Optional free text: trimmed; "" or null become null; absent stays absent (PATCH leaves it alone). */
export const optionalText = (max: number) =>
  z
    .string({ error: "Must be text" })
    .trim()
    .max(max, `Use at most ${max} characters`)
    .nullish()
    .transform((v) => (v === undefined ? undefined : v || null));

export const optionalEmail = z
  .string({ error: "Must be text" })
  .trim()
  .toLowerCase()
  .max(254, "Too long")
  .nullish()
  .transform((v) => (v === undefined ? undefined : v || null))
  .pipe(z.email("Enter a valid e-mail address").nullish());

export const customerInputSchema = z.object({
  name: z.string({ error: "Required" }).trim().min(1, "Required").max(120, "Use at most 120 characters"),
  email: optionalEmail,
  phone: optionalText(40),
  addressLine1: optionalText(160),
  addressLine2: optionalText(160),
  city: optionalText(80),
  region: optionalText(80),
  postalCode: optionalText(20),
  notes: optionalText(5000),
});
export type CustomerInput = z.output<typeof customerInputSchema>;
export type CustomerFormValues = z.input<typeof customerInputSchema>;

/** PATCH: any subset of the form's fields, at least one. */
export const customerUpdateSchema = z
  .object({
    name: customerInputSchema.shape.name.optional(),
    email: optionalEmail.optional(),
    phone: optionalText(40).optional(),
    addressLine1: optionalText(160).optional(),
    addressLine2: optionalText(160).optional(),
    city: optionalText(80).optional(),
    region: optionalText(80).optional(),
    postalCode: optionalText(20).optional(),
    notes: optionalText(5000).optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: "Nothing to change" });
export type CustomerUpdate = z.output<typeof customerUpdateSchema>;

export const customerListQuerySchema = z.object({
  ...pagingShape,
  /** Matches name, e-mail, phone, street, city or postal code (contains, case-insensitive). */
  q: z.string().trim().max(120, "Use at most 120 characters").optional(),
  archived: archivedFlagSchema,
});
export type CustomerListQuery = z.output<typeof customerListQuerySchema>;

export const customerDtoSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  email: z.string().nullable(),
  phone: z.string().nullable(),
  addressLine1: z.string().nullable(),
  addressLine2: z.string().nullable(),
  city: z.string().nullable(),
  region: z.string().nullable(),
  postalCode: z.string().nullable(),
  notes: z.string().nullable(),
  archivedAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type CustomerDto = z.infer<typeof customerDtoSchema>;

export const listMetaSchema = z.object({ page: z.number().int(), pageSize: z.number().int(), total: z.number().int() });
export type ListMeta = z.infer<typeof listMetaSchema>;
