"use server";
import { headers } from "next/headers";
import { signUpSchema } from "@/lib/schemas/people";
import { publicAction } from "@/server/action";
import { signUp } from "@/server/sign-up";

export const signUpAction = publicAction(signUpSchema, async (input) => signUp(input, await headers()));
