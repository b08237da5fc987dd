"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { Role } from "@/lib/enums";
import { Badge } from "@/components/ui/badge";
import { ConfirmButton, ConfirmDialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { Field, SelectField, StatusMessage, type Notice } from "@/components/ui/field";
import { TableShell, Td, Th } from "@/components/ui/table";
import { useSave } from "@/components/ui/use-save";
import { ROLE_LABELS } from "@/lib/permissions";
import { roleChangeQuestion, roleChangeSummary } from "@/lib/role-change";
import { inviteSchema, type InviteInput, type UpdatePersonInput } from "@/lib/schemas/people";
import { plainError, type FieldLabels } from "@/lib/validation-messages";

type PersonView = { id: string; userId: string; name: string; email: string; role: Role; status: "active" | "deactivated"; joinedAt: string; /** The day they joined, on the company's clock. */ joinedOn: string };
type InvitationView = { id: string; email: string; name: string | null; role: Role; expiresAt: string; createdAt: string; /** When the invitation lapses, on the company's clock. */ validUntil: string };

const roleOptions = (roles: readonly Role[]) => roles.map((r) => ({ value: r, label: ROLE_LABELS[r] }));
const INVITE_LABELS: FieldLabels = { email: "E-mail", name: "Name", role: "Role" };

type PersonChange = { person: PersonView; change: UpdatePersonInput; done: string };

export function PeopleClient(props: { me: string; myRole: Role; roles: Role[]; people: PersonView[]; invitations: InvitationView[] }) {
  const change = useSave<PersonChange>({
    request: ({ person, change }) => ({ url: `/api/people/${person.id}`, method: "PATCH", json: change }),
    success: (_, { done }) => done,
  });
  const withdraw = useSave<InvitationView>({
    request: (i) => ({ url: `/api/invitations/${i.id}`, method: "DELETE" }),
    success: (_, i) => `The invitation to ${i.email} is withdrawn.`,
  });
  const pending = change.pending || withdraw.pending;

  return (
    <div className="mt-6 space-y-8">
      <InviteForm roles={props.roles} invitations={props.invitations} />

      <section aria-labelledby="people-heading" className="space-y-2">
        <h2 id="people-heading" className="text-lg font-semibold">
          People
        </h2>
        <StatusMessage notice={change.notice} />
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

      <InvitationsSection invitations={props.invitations} pending={pending} notice={withdraw.notice} onWithdraw={withdraw.save} />
    </div>
  );
}

/** The invitation to send, and the open one it would replace (asked before it is). */
type Replacing = { values: InviteInput; open: InvitationView };

function InviteForm({ roles, invitations }: { roles: Role[]; invitations: InvitationView[] }) {
  const { register, handleSubmit, reset, setError, formState } = useForm<InviteInput>({
    resolver: zodResolver(inviteSchema, { error: plainError(INVITE_LABELS) }),
    defaultValues: { email: "", name: "", role: "sales_rep" },
  });
  const { errors } = formState;
  const [replacing, setReplacing] = useState<Replacing | null>(null);
  const invite = useSave<InviteInput, unknown, InviteInput>({
    request: (json) => ({ url: "/api/people", method: "POST", json }),
    success: (_, v) => `Invitation sent to ${v.email.trim().toLowerCase()}.`,
    setError,
    labels: INVITE_LABELS,
    onSaved: () => reset(),
  });
  // A second invitation to the same address replaces the open one (its link stops working): asked first.
  const send = (values: InviteInput) => {
    const open = invitations.find((i) => i.email === values.email.trim().toLowerCase());
    if (open) setReplacing({ values, open });
    else invite.save(values);
  };

  return (
    <section aria-labelledby="invite-heading" className="card p-5">
      <h2 id="invite-heading" className="text-lg font-semibold">
        Invite someone
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">They get an e-mail with a link to set their password. The link works for 7 days.</p>
      <form onSubmit={handleSubmit(send, invite.invalid)} noValidate className="mt-4 space-y-3">
        <div className="grid gap-4 md:grid-cols-[2fr_2fr_1.5fr_auto] md:items-start">
          <Field id="invite-email" label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register("email")} />
          <Field id="invite-name" label="Name (optional)" autoComplete="off" error={errors.name?.message} {...register("name")} />
          <SelectField id="invite-role" label="Role" options={roleOptions(roles)} error={errors.role?.message} {...register("role")} />
          <button type="submit" className="btn-primary md:mt-6" disabled={invite.pending}>
            {invite.pending ? "Sending…" : "Send invitation"}
          </button>
        </div>
        <StatusMessage notice={invite.notice} />
      </form>
      {replacing ? (
        <ConfirmDialog
          title="Replace the open invitation?"
          message={`An invitation for ${replacing.open.email} as ${ROLE_LABELS[replacing.open.role]} is open; replace it with ${ROLE_LABELS[replacing.values.role as Role]}? The link already sent stops working.`}
          confirmLabel={`Replace with ${ROLE_LABELS[replacing.values.role as Role]}`}
          onConfirm={() => invite.save({ ...replacing.values, replace: true })}
          onClose={() => setReplacing(null)}
        />
      ) : null}
    </section>
  );
}

/** One person: their role (locked for oneself, and for an owner unless an owner changes it), status and the button to (re)activate them. */
function PersonRow({ person: p, me, myRole, roles: allowed, pending, onChange }: { person: PersonView; me: string; myRole: Role; roles: Role[]; pending: boolean; onChange: (change: PersonChange) => void }) {
  const isMe = p.userId === me;
  const locked = isMe || (p.role === "owner" && myRole !== "owner");
  const roles = locked ? [p.role] : allowed.includes(p.role) ? allowed : [p.role, ...allowed];
  // The role picked in the list, waiting for "Make …" in the dialog; the list shows the saved role meanwhile.
  const [asked, setAsked] = useState<Role | null>(null);
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
          onChange={(e) => setAsked(e.target.value as Role)}
        />
        {asked ? (
          <ConfirmDialog
            title={roleChangeQuestion(p.name, p.role, asked)}
            message={roleChangeSummary(p.role, asked)}
            confirmLabel={`Make ${ROLE_LABELS[asked]}`}
            onConfirm={() => onChange({ person: p, change: { role: asked }, done: `${p.name} is now ${ROLE_LABELS[asked]}.` })}
            onClose={() => setAsked(null)}
          />
        ) : null}
      </Td>
      <Td>{p.status === "active" ? <Badge tone="success">Active</Badge> : <Badge tone="danger">Deactivated</Badge>}</Td>
      <Td>{p.joinedOn}</Td>
      <Td className="text-right">
        {locked ? null : p.status === "active" ? (
          <ConfirmButton
            label="Deactivate"
            danger
            disabled={pending}
            title={`Deactivate ${p.name}?`}
            message={`${p.name} is signed out on every device at once and cannot sign in until reactivated. The company keeps their deals, records and history as they are.`}
            confirmLabel={`Deactivate ${p.name}`}
            onConfirm={() => onChange({ person: p, change: { status: "deactivated" }, done: `${p.name} is deactivated and signed out.` })}
          />
        ) : (
          <button type="button" className="btn-quiet" disabled={pending} onClick={() => onChange({ person: p, change: { status: "active" }, done: `${p.name} can sign in again.` })}>
            Reactivate
          </button>
        )}
      </Td>
    </tr>
  );
}

/** Invitations not yet taken up, each with a button to withdraw it. */
function InvitationsSection({ invitations, pending, notice, onWithdraw }: { invitations: InvitationView[]; pending: boolean; notice: Notice | null; onWithdraw: (invitation: InvitationView) => void }) {
  return (
    <section aria-labelledby="invitations-heading" className="space-y-2">
      <h2 id="invitations-heading" className="text-lg font-semibold">
        Open invitations
      </h2>
      <StatusMessage notice={notice} />
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
