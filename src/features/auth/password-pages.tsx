import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Link, useSearchParams } from 'react-router-dom';
import { ForgotPasswordInput, PasswordSchema } from '@shared/schema/auth';
import { api } from '../../lib/api-client';
import { applyServerIssues } from '../../lib/forms';
import { Field, Input } from '../../components/ui/field';
import { Button } from '../../components/ui/button';
import { Alert } from '../../components/ui/card';
import { AuthFrame } from './components/auth-frame';

export function ForgotPasswordPage() {
  const [sent, setSent] = useState('');
  const [formError, setFormError] = useState('');
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<z.input<typeof ForgotPasswordInput>>({
    resolver: zodResolver(ForgotPasswordInput),
  });
  const onSubmit = handleSubmit(async (values) => {
    try {
      const res = await api.post<{ message: string }>('/api/auth/password/forgot', values);
      setSent(res.message);
    } catch (err) {
      setFormError(applyServerIssues(err, setError, ['email']));
    }
  });
  return (
    <AuthFrame title="Reset your password">
      {sent ? (
        <Alert tone="go" title="Check your e-mail">{sent}</Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          {formError && <Alert>{formError}</Alert>}
          <Field label="E-mail" hint="We send a link that works once, for one hour." error={errors.email?.message}>
            <Input type="email" autoComplete="username" {...register('email')} />
          </Field>
          <Button type="submit" size="lg" busy={isSubmitting}>Send the link</Button>
        </form>
      )}
      <p className="mt-4 text-center"><Link to="/sign-in" className="font-semibold underline underline-offset-4">Back to sign-in</Link></p>
    </AuthFrame>
  );
}

const NewPassword = z.object({ password: PasswordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });

export function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const [done, setDone] = useState(false);
  const [formError, setFormError] = useState('');
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<z.infer<typeof NewPassword>>({ resolver: zodResolver(NewPassword) });
  const onSubmit = handleSubmit(async ({ password }) => {
    try {
      await api.post('/api/auth/password/reset', { token, password });
      setDone(true);
    } catch (err) {
      setFormError(applyServerIssues(err, setError, ['password']));
    }
  });
  return (
    <AuthFrame title="Choose a new password">
      {done ? (
        <Alert tone="go" title="Password changed">You can sign in with it now. Other sessions were signed out.</Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          {formError && <Alert>{formError}</Alert>}
          <Field label="New password" hint="At least 10 characters." error={errors.password?.message}>
            <Input type="password" autoComplete="new-password" {...register('password')} />
          </Field>
          <Field label="The same again" error={errors.confirm?.message}>
            <Input type="password" autoComplete="new-password" {...register('confirm')} />
          </Field>
          <Button type="submit" size="lg" busy={isSubmitting}>Save the password</Button>
        </form>
      )}
      <p className="mt-4 text-center"><Link to="/sign-in" className="font-semibold underline underline-offset-4">Go to sign-in</Link></p>
    </AuthFrame>
  );
}
