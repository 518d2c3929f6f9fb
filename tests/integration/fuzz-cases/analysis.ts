import fc from "fast-check";
import { fuzzCase, type FuzzCase } from "../../support/fuzz";
import { firstUnitOf } from "../../support/matrix";
import type { RoleWorld } from "../../support/role-world";

// Fuzz cases for the stored-analysis routes (read-only).

type Fx = { world: RoleWorld; unit1: number; unit2: number };
const setup = async (world: RoleWorld): Promise<Fx> => ({ world, unit1: await firstUnitOf(world.engine1), unit2: await firstUnitOf(world.engine2) });

export const fuzzCases: Record<string, FuzzCase<Fx>> = {
  "GET /api/engines/[engineId]/analysis": fuzzCase({
    as: "chief",
    setup,
    params: (fx) => fc.constantFrom(fx.world.engine1, fx.world.engine2).map((id) => ({ engineId: String(id) })),
  }),
  "GET /api/units/[unitId]/analysis": fuzzCase({
    as: "engineer",
    setup,
    params: (fx) => fc.constantFrom(fx.unit1, fx.unit2).map((id) => ({ unitId: String(id) })),
  }),
};
