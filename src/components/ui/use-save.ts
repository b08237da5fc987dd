"use client";
// The one way the office screens change data: a JSON route handler (withMember) called with
// api() inside TanStack Query's useMutation. On success it refreshes the one way (router.refresh()
// for server-rendered data, invalidating the screen's queries where it reads with useQuery) and
// shows the status message; the server's field errors land on the form's fields, named by the
// form's labels, and a refusal's status line names the first field ("Not saved: Latitude (°N) is
// required."), never a dotted path.
import { useMutation, useQueryClient, type QueryKey } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { FieldErrors, FieldValues, UseFormSetError } from "react-hook-form";
import { api, ApiError } from "@/lib/api-client";
import { applyFieldErrors, formErrorList } from "@/lib/form-errors";
import { notSavedMessage, relabelFields, type FieldLabels } from "@/lib/validation-messages";
import type { Notice } from "./status-message";

/** JSON, or a multipart form for uploads (`body`). */
export type SaveRequest = { url: string; method: "POST" | "PUT" | "PATCH" | "DELETE"; json?: unknown; body?: FormData };

type Options<I, T, F extends FieldValues> = {
  /** Where and how to send the input. */
  request: (input: I) => SaveRequest;
  /** The status message after a save (none when left out). */
  success?: string | ((data: T, input: I) => string);
  /** react-hook-form's setError: the server's field errors go onto those fields. */
  setError?: UseFormSetError<F>;
  /** For editors without react-hook-form: the server's field errors by dotted path. */
  onFieldErrors?: (fields: Record<string, string[]>) => void;
  /** Server paths start with this prefix (e.g. "values.") where the form's fields do not. */
  fieldPrefix?: string;
  /** The form's labels by field path: messages name the fields as the form shows them. */
  labels?: FieldLabels;
  /** Queries this screen reads with useQuery; invalidated after a save. */
  invalidate?: QueryKey[];
  /** Re-render the server components (default true; false where only queries show the data). */
  refresh?: boolean;
  /** Somewhere else shows the status message (a section shared by several saves). */
  notify?: (notice: Notice | null) => void;
  onSaved?: (data: T, input: I) => void;
  /** After a refusal: put back what was shown at once, or act on the error's code (an expired code, already paid). */
  onError?: (err: Error, input: I) => void;
};

export function useSave<I, T = unknown, F extends FieldValues = FieldValues>(options: Options<I, T, F>) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [ownNotice, setOwnNotice] = useState<Notice | null>(null);
  const notify = options.notify ?? setOwnNotice;
  const mutation = useMutation<T, Error, I>({
    mutationFn: (input) => {
      const { url, method, json, body } = options.request(input);
      return api<T>(url, { method, json, body });
    },
    onMutate: () => notify(null),
    onSuccess: async (data, input) => {
      await Promise.all((options.invalidate ?? []).map((queryKey) => queryClient.invalidateQueries({ queryKey })));
      if (options.refresh !== false) router.refresh();
      const text = typeof options.success === "function" ? options.success(data, input) : options.success;
      if (text) notify({ tone: "success", text });
      options.onSaved?.(data, input);
    },
    onError: (err, input) => {
      let text = err.message || "Not saved.";
      if (err instanceof ApiError && err.fields) {
        const fields = relabelFields(options.fieldPrefix ? stripPrefix(err.fields, options.fieldPrefix) : err.fields, options.labels);
        if (options.setError) applyFieldErrors(fields, options.setError);
        options.onFieldErrors?.(fields);
        if (VALIDATION_CODES.has(err.code)) text = notSavedMessage(firstMessages(fields), options.labels);
      }
      notify({ tone: "error", text });
      options.onError?.(err, input);
    },
  });
  return {
    /** Sends the input; the outcome shows in the status message. */
    save: (input: I) => mutation.mutate(input),
    /** The same, for a form's handleSubmit (resolves when done, never throws). */
    saveAndWait: (input: I) => mutation.mutateAsync(input).then(() => true, () => false),
    /** For a form's handleSubmit(onValid, invalid): a refusal before sending says so beside the button too. */
    invalid: (errors: FieldErrors) => notify({ tone: "error", text: notSavedMessage(formErrorList(errors), options.labels) }),
    pending: mutation.isPending,
    notice: ownNotice,
    setNotice: notify,
  };
}

/** Refusals whose fields are the input's (zod at the boundary, the engine's checks). */
const VALIDATION_CODES = new Set(["validation_failed", "invalid_input"]);

const firstMessages = (fields: Record<string, string[]>): [string, string][] => Object.entries(fields).flatMap(([path, [first]]) => (first ? [[path, first] as [string, string]] : []));

function stripPrefix(fields: Record<string, string[]>, prefix: string): Record<string, string[]> {
  return Object.fromEntries(Object.entries(fields).map(([k, v]) => [k.startsWith(prefix) ? k.slice(prefix.length) : k, v]));
}
