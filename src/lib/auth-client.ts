"use client";
import { createAuthClient } from "better-auth/react";

/** better-auth's browser client; same origin as the app, so no base URL. */
export const authClient = createAuthClient();
