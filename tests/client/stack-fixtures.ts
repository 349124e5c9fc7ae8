/** A small saved roof (a gable and a porch) with two stacks, and the API answers the stack screens read. */
import { gableRoof, shedRoof } from "@shared/engine/roof/generators";
import { rulesSchema } from "@shared/schemas/takeoff";
import type { RoofDto } from "@shared/schemas/roof";
import { json } from "./fetch-stub";

export const JOB_ID = 7;

export function demoRoof(): RoofDto {
  const planes = [
    ...gableRoof(30, 20, 6, { idPrefix: "main", stackId: "battens" }),
    ...shedRoof(12, 8, 2, { idPrefix: "porch", origin: [40, 0], stackId: "mesh" }),
  ];
  return {
    version: 3,
    planes: planes as RoofDto["planes"],
    stacks: [
      {
        id: "battens",
        name: "Battens with foil",
        spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: false } },
        radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: "up" },
      },
      { id: "mesh", name: "Mesh on the porch", spacer: { kind: "mesh" }, underlayment: { kind: "self-adhered" } },
    ] as unknown as RoofDto["stacks"],
    defaultStackId: "battens",
  };
}

export const user = { id: 2, email: "estimator@example.com", name: "Sam Example", role: "estimator", companyId: 1 };

export const job = {
  id: JOB_ID,
  status: "estimating",
  site: { atticType: "vented", codeEdition: 2021, ventException: false, coolRoofRequired: false, existingLayers: 1, tearOff: true, wind: { ratedAssemblyRequired: false } },
};

export const baseRoutes = (roof: RoofDto = demoRoof()) => ({
  "GET /api/auth/me": () => json(200, { user }),
  [`GET /api/jobs/${JOB_ID}/roof`]: () => json(200, { data: roof }),
  [`GET /api/jobs/${JOB_ID}`]: () => json(200, { data: job }),
  "GET /api/price-book/rules": () => json(200, { data: rulesSchema.parse({}) }),
});
