import type { FormEvent } from 'react';
import type { StaffRole } from '../../../../server/schemas/common';
import { inviteStaffRequestSchema } from '../../../../server/schemas/users';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useZodForm } from '../../../lib/use-zod-form';
import { useClients } from '../../clients/api/list-clients';
import { useInviteMember } from '../api/invite-member';

const roleOptions: Array<{ value: StaffRole; label: string }> = [
  { value: 'photographer', label: 'Photographer (studio staff)' },
  { value: 'coordinator', label: 'Coordinator (HR at a client)' },
  { value: 'studio_admin', label: 'Studio admin' },
];

export function InviteMemberForm() {
  const clients = useClients();
  const form = useZodForm(inviteStaffRequestSchema, {
    email: '',
    displayName: '',
    role: 'photographer',
    clientId: null,
  });
  const invite = useInviteMember();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = form.validate();
    if (!input) return;
    invite.mutate(input, {
      onSuccess: () =>
        form.setValues({ email: '', displayName: '', role: input.role, clientId: input.clientId }),
      onError: form.showServerError,
    });
  };

  const clientOptions = [
    { value: '', label: 'Choose a client…' },
    ...(clients.data?.clients ?? []).map((client) => ({ value: client.id, label: client.name })),
  ];

  return (
    <form
      onSubmit={submit}
      noValidate
      className="flex flex-col gap-4"
      aria-label="Invite a team member"
    >
      {form.formError ? <Notice tone="danger">{form.formError}</Notice> : null}
      {invite.isSuccess ? (
        <Notice tone="success">
          {invite.data.displayName} was invited: a link to choose a password is on its way to{' '}
          {invite.data.email}.
        </Notice>
      ) : null}
      <TextField
        label="Name"
        value={form.values.displayName}
        onChange={(value) => form.set('displayName', value)}
        error={form.errors.displayName}
      />
      <TextField
        label="E-mail"
        type="email"
        value={form.values.email}
        onChange={(value) => form.set('email', value)}
        error={form.errors.email}
      />
      <SelectField
        label="Role"
        value={form.values.role}
        options={roleOptions}
        onChange={(value) => {
          form.set('role', value as StaffRole);
          if (value !== 'coordinator') form.set('clientId', null);
        }}
        error={form.errors.role}
      />
      {form.values.role === 'coordinator' ? (
        <SelectField
          label="Client"
          value={form.values.clientId ?? ''}
          options={clientOptions}
          onChange={(value) => form.set('clientId', value || null)}
          error={form.errors.clientId}
          hint="A coordinator sees only this client's people and photos."
        />
      ) : null}
      <Button type="submit" busy={invite.isPending}>
        Send invitation
      </Button>
    </form>
  );
}
