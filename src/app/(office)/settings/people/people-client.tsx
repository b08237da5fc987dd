"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState, useTransition } from "react";
import { useForm } from "react-hook-form";
import type { Role } from "@/lib/enums";
import { Field, FormMessage } from "@/components/ui/field";
import { applyFieldErrors } from "@/lib/form-errors";
import { formatDate } from "@/lib/format";
import { ROLE_LABELS } from "@/lib/permissions";
import { inviteSchema, type InviteInput } from "@/lib/schemas/people";
import { invitePersonAction, revokeInvitationAction, updatePersonAction } from "./actions";

type PersonView = { id: string; userId: string; name: string; email: string; role: Role; status: "active" | "deactivated"; joinedAt: string };
type InvitationView = { id: string; email: string; name: string | null; role: Role; expiresAt: string; createdAt: string };

export function PeopleClient(props: { me: string; myRole: Role; roles: Role[]; people: PersonView[]; invitations: InvitationView[] }) {
  const [notice, setNotice] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [pending, startTransition] = useTransition();

  function run(task: () => Promise<{ ok: boolean; message?: string }>, done: string) {
    setNotice(null);
    startTransition(async () => {
      const result = await task();
      setNotice(result.ok ? { tone: "success", text: done } : { tone: "error", text: result.message ?? "Not saved." });
    });
  }

  return (
    <div className="mt-6 space-y-8">
      {notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}
      <InviteForm roles={props.roles} onSent={(email) => setNotice({ tone: "success", text: `Invitation sent to ${email}.` })} />

      <section aria-labelledby="people-heading">
        <h2 id="people-heading" className="text-lg font-semibold">
          People
        </h2>
        <div className="mt-2 overflow-x-auto rounded-card border border-paper-line bg-white">
          <table className="w-full min-w-[640px] text-left text-sm">
            <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
              <tr>
                <th scope="col" className="px-4 py-2">Name</th>
                <th scope="col" className="px-4 py-2">Role</th>
                <th scope="col" className="px-4 py-2">Status</th>
                <th scope="col" className="px-4 py-2">Since</th>
                <th scope="col" className="px-4 py-2"><span className="sr-only">Actions</span></th>
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-line">
              {props.people.map((p) => {
                const isMe = p.userId === props.me;
                const locked = isMe || (p.role === "owner" && props.myRole !== "owner");
                return (
                  <tr key={p.id} data-testid={`person-${p.email}`}>
                    <td className="px-4 py-2">
                      <span className="font-medium">{p.name}</span>
                      {isMe ? <span className="ml-2 text-xs text-graphite-soft">(you)</span> : null}
                      <span className="block text-xs text-graphite-soft">{p.email}</span>
                    </td>
                    <td className="px-4 py-2">
                      <label className="sr-only" htmlFor={`role-${p.id}`}>Role of {p.name}</label>
                      <select
                        id={`role-${p.id}`}
                        className="field-input min-w-40"
                        value={p.role}
                        disabled={locked || pending}
                        onChange={(e) =>
                          run(
                            () => updatePersonAction({ membershipId: p.id, change: { role: e.target.value as Role } }),
                            `${p.name} is now ${ROLE_LABELS[e.target.value as Role]}.`,
                          )
                        }
                      >
                        {(locked ? [p.role] : props.roles.includes(p.role) ? props.roles : [p.role, ...props.roles]).map((r) => (
                          <option key={r} value={r}>
                            {ROLE_LABELS[r]}
                          </option>
                        ))}
                      </select>
                    </td>
                    <td className="px-4 py-2">
                      <span className={p.status === "active" ? "text-sage" : "text-danger"}>{p.status === "active" ? "Active" : "Deactivated"}</span>
                    </td>
                    <td className="px-4 py-2">{formatDate(new Date(p.joinedAt))}</td>
                    <td className="px-4 py-2 text-right">
                      {locked ? null : p.status === "active" ? (
                        <button
                          type="button"
                          className="btn-danger"
                          disabled={pending}
                          onClick={() => run(() => updatePersonAction({ membershipId: p.id, change: { status: "deactivated" } }), `${p.name} is deactivated and signed out.`)}
                        >
                          Deactivate
                        </button>
                      ) : (
                        <button
                          type="button"
                          className="btn-quiet"
                          disabled={pending}
                          onClick={() => run(() => updatePersonAction({ membershipId: p.id, change: { status: "active" } }), `${p.name} can sign in again.`)}
                        >
                          Reactivate
                        </button>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </section>

      <section aria-labelledby="invitations-heading">
        <h2 id="invitations-heading" className="text-lg font-semibold">
          Open invitations
        </h2>
        {props.invitations.length === 0 ? (
          <p className="mt-1 text-graphite-soft">None.</p>
        ) : (
          <ul className="mt-2 divide-y divide-paper-line rounded-card border border-paper-line bg-white">
            {props.invitations.map((i) => (
              <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-2" data-testid={`invitation-${i.email}`}>
                <span>
                  <span className="font-medium">{i.email}</span>
                  <span className="block text-xs text-graphite-soft">
                    {ROLE_LABELS[i.role]} · valid until {formatDate(new Date(i.expiresAt))}
                  </span>
                </span>
                <button type="button" className="btn-quiet" disabled={pending} onClick={() => run(() => revokeInvitationAction({ invitationId: i.id }), `The invitation to ${i.email} is withdrawn.`)}>
                  Withdraw
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}

function InviteForm({ roles, onSent }: { roles: Role[]; onSent: (email: string) => void }) {
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<InviteInput>({ resolver: zodResolver(inviteSchema), defaultValues: { email: "", name: "", role: "sales_rep" } });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const result = await invitePersonAction(values);
    if (!result.ok) {
      if (!applyFieldErrors(result.fieldErrors, setFieldError)) setError(result.message);
      return;
    }
    reset();
    onSent(values.email.trim().toLowerCase());
  });

  return (
    <section aria-labelledby="invite-heading" className="card p-5">
      <h2 id="invite-heading" className="text-lg font-semibold">
        Invite someone
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">They get an e-mail with a link to set their password. The link works for 7 days.</p>
      <form onSubmit={onSubmit} noValidate className="mt-4 grid gap-4 md:grid-cols-[2fr_2fr_1.5fr_auto] md:items-start">
        {error ? (
          <div className="md:col-span-4">
            <FormMessage tone="error">{error}</FormMessage>
          </div>
        ) : null}
        <Field id="invite-email" label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register("email")} />
        <Field id="invite-name" label="Name (optional)" autoComplete="off" error={errors.name?.message} {...register("name")} />
        <div>
          <label htmlFor="invite-role" className="field-label">
            Role
          </label>
          <select id="invite-role" className="field-input" aria-invalid={errors.role ? true : undefined} {...register("role")}>
            {roles.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
          {errors.role ? <p className="field-error">{errors.role.message}</p> : null}
        </div>
        <button type="submit" className="btn-primary md:mt-6" disabled={isSubmitting}>
          {isSubmitting ? "Sending…" : "Send invitation"}
        </button>
      </form>
    </section>
  );
}
