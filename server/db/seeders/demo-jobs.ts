/**
 * Demo customers, jobs, roofs and crew assignments for one company (all invented: a fictional town,
 * invented streets, e-mails at example.com, phone numbers in the 555-01xx range set aside for fiction).
 *
 * - 14 customers in Brindlemere and 15 jobs, two or more in every status;
 * - every job past `lead` has a roof of three or more planes built with the engine's generators
 *   (gable, hip, an L-shaped gable with valleys, a low porch shed, a steep 12/12 upper roof), and its
 *   takeoff is computed by the same function the roof save uses (the company's price-book rules);
 * - the stacks use every spacer kind: none, battens, counter-battens, 3D mesh and dimpled sheet;
 * - the crew member (crew@example.com in the demo) is assigned to some jobs, not all.
 * `quote_total_cents` is left empty: the demo quotes fill it.
 *
 * Safe to call twice: a company that already has customers is left alone (returns false).
 */
import type { Sequelize, Transaction } from "sequelize";
import { gableRoof, hipRoof, lShapeGableRoof, shedRoof, type GeneratedPlane } from "../../../shared/engine/roof/generators";
import { jobSiteSchema, type JobStatus } from "../../../shared/schemas/job";
import { roofSaveSchema, type RoofDocument, type RoofSaveValues } from "../../../shared/schemas/roof";
import { AuditEvent, Customer, Job, JobCrew, Roof } from "../../models/index";
import { computeStoredTakeoff, takeoffSquares } from "../../services/roof-takeoff";

export interface DemoUser {
  id: number;
  email: string;
  name: string;
  role: "owner" | "estimator" | "crew";
}

export const DEMO_TOWN = { city: "Brindlemere", region: "Westmarch" };

type StackValues = RoofSaveValues["stacks"][number];

/** Layer stacks, one per spacer option (and foil over an air space where the gap allows it). */
const STACKS = {
  plain: {
    id: "plain",
    name: "Synthetic, panels on the deck",
    underlayment: { kind: "synthetic", highTemp: true },
    spacer: { kind: "none" },
  },
  battens: {
    id: "battens",
    name: "1x4 battens at 24 in with foil",
    underlayment: { kind: "synthetic", highTemp: true },
    spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: false } },
    radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: "up" },
  },
  counter: {
    id: "counter",
    name: "Counter-battens for a vented channel",
    underlayment: { kind: "self-adhered", highTemp: true },
    spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: true, counterBattenNominal: "1x3", counterBattenSpacingIn: 24 } },
    radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: "up" },
  },
  mesh: {
    id: "mesh",
    name: "3D mesh mat on the low slopes",
    underlayment: { kind: "self-adhered", highTemp: true },
    spacer: { kind: "mesh", thicknessIn: 0.375 },
  },
  dimpled: {
    id: "dimpled",
    name: "Dimpled sheet over felt",
    underlayment: { kind: "felt", highTemp: false, feltNumber: 30 },
    spacer: { kind: "dimpled", thicknessIn: 0.4 },
    panel: { system: "exposed-fastener", coverageWidthIn: 36, gauge: 26 },
  },
} satisfies Record<string, StackValues>;
type StackKey = keyof typeof STACKS;

/** A low porch shed at 2/12 set apart from the house in plan (its own little roof). */
const porch = (origin: [number, number], stackId: StackKey = "mesh") =>
  shedRoof(14, 8, 2, { idPrefix: "porch", origin, stackId }).map((p) => ({ ...p, name: "Porch" }));

/** The five roof shapes of the demo; each has three or more planes. */
const SHAPES: Record<string, (main: StackKey) => GeneratedPlane[]> = {
  gableWithPorch: (main) => [...gableRoof(42, 28, 6, { idPrefix: "house", stackId: main }), ...porch([50, 0])],
  hip: (main) => hipRoof(48, 32, 5, { idPrefix: "hip", stackId: main }),
  lShape: (main) => [
    ...lShapeGableRoof({ mainWidthFt: 50, mainDepthFt: 30, wingWidthFt: 22, wingDepthFt: 18, wingOffsetFt: 8 }, 7, { idPrefix: "ell", stackId: main }),
    ...porch([60, -10]),
  ],
  steepUpper: (main) => [
    // A two-storey block with a steep 12/12 roof, a one-storey hip wing beside it, a porch in front.
    ...gableRoof(30, 24, 12, { idPrefix: "upper", baseElevationFt: 19, stackId: main }).map((p) => ({ ...p, name: `Upper ${p.name.toLowerCase()}` })),
    ...hipRoof(24, 20, 4, { idPrefix: "wing", origin: [40, 0], stackId: "plain" }),
    ...porch([0, -20]),
  ],
  lowPorchHip: (main) => [...hipRoof(36, 36, 6, { idPrefix: "pyr", stackId: main }), ...porch([46, 10], "dimpled")],
};

interface DemoJobSpec {
  customer: number;
  status: JobStatus;
  shape?: keyof typeof SHAPES;
  main?: StackKey;
  estimator: "estimator" | "owner" | null;
  crew?: boolean;
  daysAgo: number;
  site?: Record<string, unknown>;
  notes?: string;
}

const CUSTOMERS = [
  { name: "Corliss Amberley", street: "14 Cobblewick Lane" },
  { name: "Teodor Haskins-Wray", street: "203 Heronsgate Row" },
  { name: "Nadia Pellworth", street: "7 Millrace Court" },
  { name: "Bram Oosterhuis", street: "58 Sorrelbrook Drive" },
  { name: "Wren Castellane", street: "1120 Ambergate Way" },
  { name: "Priya Dunmore", street: "33 Pipit Hill Road" },
  { name: "Elias Thornquist", street: "9 Wickerby Street" },
  { name: "Maren Ostrand", street: "412 Tansy Ridge Road" },
  { name: "Joaquin Belcourt", street: "26 Saltfern Close" },
  { name: "Sunniva Raskel", street: "71 Glimmerdale Road" },
  { name: "Odell Fairweather", street: "5 Copperbeech Terrace" },
  { name: "Hattie Marchbank", street: "88 Owlcote Lane" },
  { name: "Ansel Kowal-Reed", street: "140 Fallowmead Drive" },
  { name: "Lucinda Brimble", street: "17 Quarrystone Bend" },
];

const WINDY = { ratedAssemblyRequired: true, basicWindSpeedMph: 115, exposure: "C", meanRoofHeightFt: 22, leastHorizontalDimensionFt: 28 };

const JOBS: DemoJobSpec[] = [
  { customer: 0, status: "lead", estimator: "estimator", daysAgo: 1, notes: "Called about leaks over the back bedroom; visit booked." },
  { customer: 1, status: "lead", estimator: null, daysAgo: 3 },
  { customer: 2, status: "estimating", shape: "gableWithPorch", main: "battens", estimator: "estimator", daysAgo: 2 },
  { customer: 3, status: "estimating", shape: "steepUpper", main: "counter", estimator: "owner", daysAgo: 5, site: { wind: WINDY } },
  { customer: 4, status: "proposed", shape: "hip", main: "plain", estimator: "estimator", daysAgo: 6 },
  { customer: 5, status: "proposed", shape: "lShape", main: "mesh", estimator: "estimator", daysAgo: 9 },
  { customer: 6, status: "won", shape: "lowPorchHip", main: "dimpled", estimator: "owner", crew: true, daysAgo: 8 },
  { customer: 7, status: "won", shape: "gableWithPorch", main: "counter", estimator: "estimator", daysAgo: 12 },
  { customer: 8, status: "scheduled", shape: "lShape", main: "battens", estimator: "estimator", crew: true, daysAgo: 4, notes: "Dumpster on the driveway side; neighbour's car moved by 7 am." },
  { customer: 9, status: "scheduled", shape: "steepUpper", main: "battens", estimator: "owner", crew: true, daysAgo: 7, site: { wind: WINDY } },
  { customer: 10, status: "installed", shape: "hip", main: "mesh", estimator: "estimator", crew: true, daysAgo: 20 },
  { customer: 11, status: "installed", shape: "lowPorchHip", main: "plain", estimator: "estimator", daysAgo: 34 },
  { customer: 12, status: "lost", shape: "gableWithPorch", main: "dimpled", estimator: "estimator", daysAgo: 15, notes: "Went with a shingle re-roof." },
  { customer: 13, status: "lost", shape: "hip", main: "battens", estimator: "owner", daysAgo: 40, notes: "Quote expired; no answer since." },
  { customer: 2, status: "estimating", shape: "lShape", main: "counter", estimator: "estimator", daysAgo: 1, notes: "Detached workshop behind the house." },
];

function roofFor(spec: DemoJobSpec): RoofDocument {
  const main = spec.main ?? "plain";
  const planes = SHAPES[spec.shape!](main);
  const used = new Set<StackKey>([main, ...planes.map((p) => (p.stackId ?? main) as StackKey)]);
  const body: RoofSaveValues = {
    planes,
    stacks: [...used].map((k) => STACKS[k]),
    defaultStackId: main,
    version: 0,
  };
  const { version: _v, underlay: _u, ...doc } = roofSaveSchema.parse(body);
  return doc;
}

const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000);

/** Seeds the demo jobs for one company; false when the company already has customers. */
export async function seedDemoJobs(
  sequelize: Sequelize,
  companyId: number,
  users: DemoUser[],
  transaction?: Transaction,
): Promise<boolean> {
  const run = async (t: Transaction) => {
    if ((await Customer.count({ where: { companyId }, transaction: t })) > 0) return false;
    const byRole = (role: DemoUser["role"]) => users.find((u) => u.role === role) ?? null;
    const owner = byRole("owner");
    const estimator = byRole("estimator") ?? owner;
    const crew = users.find((u) => u.email === "crew@example.com") ?? byRole("crew");
    const actorId = estimator?.id ?? owner?.id ?? null;

    const customers: Customer[] = [];
    for (const [i, c] of CUSTOMERS.entries()) {
      const [first, last] = c.name.toLowerCase().replace(/[^a-z ]/g, "").split(" ");
      customers.push(
        await Customer.create(
          {
            companyId,
            name: c.name,
            email: `${first}.${last}@example.com`,
            phone: `555-01${String(10 + i).padStart(2, "0")}`,
            addressLine1: c.street,
            addressLine2: null,
            city: DEMO_TOWN.city,
            region: DEMO_TOWN.region,
            postalCode: `BM-${String(201 + (i % 5) * 3)}`,
            notes: null,
          },
          { transaction: t },
        ),
      );
    }

    /** When each customer's first job was created. */
    const customerSince = new Map<number, Date>();
    for (const spec of JOBS) {
      const customer = customers[spec.customer];
      const site = jobSiteSchema.parse({
        atticType: "vented",
        atticFloorAreaSqFt: 1400,
        climateZone: "5A",
        iceDamRisk: true,
        existingLayers: 1,
        tearOff: true,
        ...spec.site,
      });
      const estimatorId = spec.estimator === "owner" ? (owner?.id ?? null) : spec.estimator === "estimator" ? (estimator?.id ?? null) : null;
      const job = await Job.create(
        {
          companyId,
          customerId: customer.id,
          siteAddressLine1: customer.addressLine1,
          siteAddressLine2: null,
          siteCity: customer.city,
          siteRegion: customer.region,
          sitePostalCode: customer.postalCode,
          status: spec.status,
          estimatorId,
          site,
          notes: spec.notes ?? null,
        },
        { transaction: t },
      );
      await AuditEvent.create(
        { companyId, actorId, entityType: "job", entityId: String(job.id), jobId: job.id, action: "created", changes: { customerName: customer.name } },
        { transaction: t },
      );
      if (spec.shape) {
        const document = roofFor(spec);
        const takeoff = await computeStoredTakeoff(document, site, companyId, t);
        await Roof.create({ jobId: job.id, companyId, version: 1, document, takeoff }, { transaction: t });
        await job.update({ squares: takeoffSquares(takeoff) }, { transaction: t });
        await AuditEvent.create(
          {
            companyId,
            actorId: estimatorId ?? actorId,
            entityType: "roof",
            entityId: String(job.id),
            jobId: job.id,
            action: "created",
            changes: { version: { from: 0, to: 1 }, planes: document.planes.length, stacks: document.stacks.length },
          },
          { transaction: t },
        );
      }
      if (spec.crew && crew) await JobCrew.create({ jobId: job.id, userId: crew.id }, { transaction: t });
      // Spread the board's "last change" over the past weeks.
      const when = daysAgo(spec.daysAgo);
      const created = daysAgo(spec.daysAgo + 3);
      await sequelize.query("UPDATE jobs SET created_at = ?, updated_at = ? WHERE id = ?", {
        replacements: [created, when, job.id],
        transaction: t,
      });
      const known = customerSince.get(customer.id);
      if (!known || created < known) customerSince.set(customer.id, created);
    }
    // Each customer was added with their first job (the customers list's "last change" is not all today).
    for (const [customerId, since] of customerSince) {
      await sequelize.query("UPDATE customers SET created_at = ?, updated_at = ? WHERE id = ?", {
        replacements: [since, since, customerId],
        transaction: t,
      });
    }
    return true;
  };
  return transaction ? run(transaction) : sequelize.transaction(run);
}
