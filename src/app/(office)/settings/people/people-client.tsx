"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { Role } from "@/lib/enums";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/empty-state";
import { Field, SelectField, StatusMessage, type Notice } from "@/components/ui/field";
import { TableShell, Td, Th } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import { ROLE_LABELS } from "@/lib/permissions";
import { inviteSchema, type InviteInput, type UpdatePersonInput } from "@/lib/schemas/people";

type PersonView = { id: string; userId: string; name: string; email: string; role: Role; status: "active" | "deactivated"; joinedAt: string; /** The day they joined, on the company's clock. */ joinedOn: string };
type InvitationView = { id: string; email: string; name: string | null; role: Role; expiresAt: string; createdAt: string; /** When the invitation lapses, on the company's clock. */ validUntil: string };

const roleOptions = (roles: readonly Role[]) => roles.map((r) => ({ value: r, label: ROLE_LABELS[r] }));

type PersonChange = { person: PersonView; change: UpdatePersonInput; done: string };

export function PeopleClient(props: { me: string; myRole: Role; roles: Role[]; people: PersonView[]; invitations: InvitationView[] }) {
  const [notice, setNotice] = useState<Notice | null>(null);
  const change = useSave<PersonChange>({
    request: ({ person, change }) => ({ url: `/api/people/${person.id}`, method: "PATCH", json: change }),
    success: (_, { done }) => done,
    notify: setNotice,
  });
  const withdraw = useSave<InvitationView>({
    request: (i) => ({ url: `/api/invitations/${i.id}`, method: "DELETE" }),
    success: (_, i) => `The invitation to ${i.email} is withdrawn.`,
    notify: setNotice,
  });
  const pending = change.pending || withdraw.pending;

  return (
    <div className="mt-6 space-y-8">
      <StatusMessage notice={notice} />
      <InviteForm roles={props.roles} notify={setNotice} />

      <section aria-labelledby="people-heading" className="space-y-2">
        <h2 id="people-heading" className="text-lg font-semibold">
          People
        </h2>
        <TableShell
          minWidth={640}
          head={
            <>
              <Th>Name</Th>
              <Th>Role</Th>
              <Th>Status</Th>
              <Th>Since</Th>
              <Th>
                <span className="sr-only">Actions</span>
              </Th>
            </>
          }
        >
          {props.people.map((p) => (
            <PersonRow key={p.id} person={p} me={props.me} myRole={props.myRole} roles={props.roles} pending={pending} onChange={change.save} />
          ))}
        </TableShell>
      </section>

      <InvitationsSection invitations={props.invitations} pending={pending} onWithdraw={withdraw.save} />
    </div>
  );
}

function InviteForm({ roles, notify }: { roles: Role[]; notify: (notice: Notice | null) => void }) {
  const { register, handleSubmit, reset, setError, formState } = useForm<InviteInput>({
    resolver: zodResolver(inviteSchema),
    defaultValues: { email: "", name: "", role: "sales_rep" },
  });
  const { errors } = formState;
  const invite = useSave<InviteInput, unknown, InviteInput>({
    request: (json) => ({ url: "/api/people", method: "POST", json }),
    success: (_, v) => `Invitation sent to ${v.email.trim().toLowerCase()}.`,
    setError,
    notify,
    onSaved: () => reset(),
  });

  return (
    <section aria-labelledby="invite-heading" className="card p-5">
      <h2 id="invite-heading" className="text-lg font-semibold">
        Invite someone
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">They get an e-mail with a link to set their password. The link works for 7 days.</p>
      <form onSubmit={handleSubmit(invite.save)} noValidate className="mt-4 grid gap-4 md:grid-cols-[2fr_2fr_1.5fr_auto] md:items-start">
        <Field id="invite-email" label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register("email")} />
        <Field id="invite-name" label="Name (optional)" autoComplete="off" error={errors.name?.message} {...register("name")} />
        <SelectField id="invite-role" label="Role" options={roleOptions(roles)} error={errors.role?.message} {...register("role")} />
        <button type="submit" className="btn-primary md:mt-6" disabled={invite.pending}>
          {invite.pending ? "Sending…" : "Send invitation"}
        </button>
      </form>
    </section>
  );
}

/** One person: their role (locked for oneself, and for an owner unless an owner changes it), status and the button to (re)activate them. */
function PersonRow({ person: p, me, myRole, roles: allowed, pending, onChange }: { person: PersonView; me: string; myRole: Role; roles: Role[]; pending: boolean; onChange: (change: PersonChange) => void }) {
  const isMe = p.userId === me;
  const locked = isMe || (p.role === "owner" && myRole !== "owner");
  const roles = locked ? [p.role] : allowed.includes(p.role) ? allowed : [p.role, ...allowed];
  return (
    <tr data-testid={`person-${p.email}`}>
      <Td>
        <span className="font-medium">{p.name}</span>
        {isMe ? <span className="ml-2 text-xs text-graphite-soft">(you)</span> : null}
        <span className="block text-xs text-graphite-soft">{p.email}</span>
      </Td>
      <Td>
        <SelectField
          id={`role-${p.id}`}
          label={`Role of ${p.name}`}
          srLabel
          selectClassName="min-w-40"
          options={roleOptions(roles)}
          value={p.role}
          disabled={locked || pending}
          onChange={(e) => {
            const role = e.target.value as Role;
            onChange({ person: p, change: { role }, done: `${p.name} is now ${ROLE_LABELS[role]}.` });
          }}
        />
      </Td>
      <Td>{p.status === "active" ? <Badge tone="success">Active</Badge> : <Badge tone="danger">Deactivated</Badge>}</Td>
      <Td>{p.joinedOn}</Td>
      <Td className="text-right">
        {locked ? null : (
          <button
            type="button"
            className={p.status === "active" ? "btn-danger" : "btn-quiet"}
            disabled={pending}
            onClick={() =>
              p.status === "active"
                ? onChange({ person: p, change: { status: "deactivated" }, done: `${p.name} is deactivated and signed out.` })
                : onChange({ person: p, change: { status: "active" }, done: `${p.name} can sign in again.` })
            }
          >
            {p.status === "active" ? "Deactivate" : "Reactivate"}
          </button>
        )}
      </Td>
    </tr>
  );
}

/** Invitations not yet taken up, each with a button to withdraw it. */
function InvitationsSection({ invitations, pending, onWithdraw }: { invitations: InvitationView[]; pending: boolean; onWithdraw: (invitation: InvitationView) => void }) {
  return (
    <section aria-labelledby="invitations-heading" className="space-y-2">
      <h2 id="invitations-heading" className="text-lg font-semibold">
        Open invitations
      </h2>
      {invitations.length === 0 ? (
        <EmptyState>None.</EmptyState>
      ) : (
        <ul className="divide-y divide-paper-line rounded-card border border-paper-line bg-white">
          {invitations.map((i) => (
            <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-2" data-testid={`invitation-${i.email}`}>
              <span>
                <span className="font-medium">{i.email}</span>
                <span className="block text-xs text-graphite-soft">
                  {ROLE_LABELS[i.role]} · valid until {i.validUntil}
                </span>
              </span>
              <button type="button" className="btn-quiet" disabled={pending} onClick={() => onWithdraw(i)}>
                Withdraw
              </button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
