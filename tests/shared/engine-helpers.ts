import { isGeometryError, planeGeometry, type PlaneGeometry, type PlaneShapeInput } from "@shared/engine/roof/geometry";

/** Geometry of planes that must be valid (throws otherwise). */
export function geoms(planes: PlaneShapeInput[]): PlaneGeometry[] {
  return planes.map((p, i) => {
    const g = planeGeometry(p, i);
    if (isGeometryError(g)) throw new Error(`${g.reason} at ${g.path.join(".")}`);
    return g;
  });
}

/** A minimal valid takeoff input around some planes. */
export function takeoffInput(planes: unknown[], extra: Record<string, unknown> = {}) {
  return { planes, stacks: [{ id: "s" }], defaultStackId: "s", ...extra };
}
