"use server";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { inverterModelSchema, moduleModelSchema } from "@/lib/schemas/catalog";
import { memberAction } from "@/server/action";
import { createInverter, createModule, setInverterActive, setModuleActive, updateInverter, updateModule } from "@/server/catalog";

const done = <T extends { id: string }>(row: T) => {
  revalidatePath("/catalog");
  return { id: row.id };
};

export const createModuleAction = memberAction("catalog:manage", moduleModelSchema, async (input, member) => done(await createModule(member, input)));

export const updateModuleAction = memberAction(
  "catalog:manage",
  z.object({ id: z.uuid(), values: moduleModelSchema }),
  async ({ id, values }, member) => done(await updateModule(member, id, values)),
);

export const setModuleActiveAction = memberAction(
  "catalog:manage",
  z.object({ id: z.uuid(), active: z.boolean() }),
  async ({ id, active }, member) => done(await setModuleActive(member, id, active)),
);

export const createInverterAction = memberAction("catalog:manage", inverterModelSchema, async (input, member) => done(await createInverter(member, input)));

export const updateInverterAction = memberAction(
  "catalog:manage",
  z.object({ id: z.uuid(), values: inverterModelSchema }),
  async ({ id, values }, member) => done(await updateInverter(member, id, values)),
);

export const setInverterActiveAction = memberAction(
  "catalog:manage",
  z.object({ id: z.uuid(), active: z.boolean() }),
  async ({ id, active }, member) => done(await setInverterActive(member, id, active)),
);
