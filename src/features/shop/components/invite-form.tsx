import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { useQueryClient } from '@tanstack/react-query';
import { InviteInput } from '@shared/schema/auth';
import { api } from '../../../lib/api-client';
import { applyServerIssues } from '../../../lib/forms';
import { Field, Input } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/card';
import { shopKeys } from '../api/queries';
import { RolePicker } from './role-picker';

type Values = z.input<typeof InviteInput>;

export function InviteForm() {
  const qc = useQueryClient();
  const [notice, setNotice] = useState('');
  const [formError, setFormError] = useState('');
  const { register, control, handleSubmit, setError, reset, formState: { errors, isSubmitting } } = useForm<Values>({
    resolver: zodResolver(InviteInput),
    defaultValues: { email: '', name: '', roles: ['technician'] },
  });
  const onSubmit = handleSubmit(async (values) => {
    setNotice(''); setFormError('');
    try {
      await api.post('/api/shop/invitations', values);
      setNotice(`Invitation sent to ${values.email}. The link works once, for 7 days.`);
      reset();
      void qc.invalidateQueries({ queryKey: shopKeys.invitations() });
    } catch (err) {
      setFormError(applyServerIssues(err, setError, ['email', 'name', 'roles']));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      {notice && <Alert tone="go">{notice}</Alert>}
      {formError && <Alert>{formError}</Alert>}
      <Field label="E-mail" error={errors.email?.message}><Input type="email" {...register('email')} /></Field>
      <Field label="Name (optional)" error={errors.name?.message}><Input {...register('name')} /></Field>
      <div>
        <p className="font-semibold">Roles</p>
        <Controller control={control} name="roles" render={({ field }) => <RolePicker value={field.value} onChange={field.onChange} legend="Roles for the invitation" />} />
        {errors.roles && <p role="alert" className="text-sm font-semibold text-stop">{errors.roles.message}</p>}
      </div>
      <Button type="submit" busy={isSubmitting}>Send invitation</Button>
    </form>
  );
}
