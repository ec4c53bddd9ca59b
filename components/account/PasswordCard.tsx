import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { View } from 'react-native';
import { changePasswordRequestSchema, type ChangePasswordRequest } from '../../schemas/auth';
import { apiFetch, isApiRequestError } from '../data/api';
import { fieldErrorsOf, issuesOfZodError } from '../data/field-errors';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';

const FIELDS = ['currentPassword', 'newPassword'] as const;

/** Replace your password (e.g. the one an owner was shown once); other sessions end. */
export function PasswordCard() {
  const { space } = useTheme();
  const [form, setForm] = useState<ChangePasswordRequest>({ currentPassword: '', newPassword: '' });
  const [errors, setErrors] = useState<Partial<Record<(typeof FIELDS)[number], string>>>({});
  const [done, setDone] = useState(false);
  const change = useMutation({
    mutationFn: (body: ChangePasswordRequest) => apiFetch('/api/v1/auth/password', { method: 'POST', body }),
  });

  function submit() {
    setDone(false);
    const parsed = changePasswordRequestSchema.safeParse(form);
    if (!parsed.success) {
      setErrors(fieldErrorsOf(issuesOfZodError(parsed.error), FIELDS));
      return;
    }
    setErrors({});
    change.mutate(parsed.data, {
      onSuccess: () => {
        setForm({ currentPassword: '', newPassword: '' });
        setDone(true);
      },
      onError: (e) => {
        if (isApiRequestError(e)) setErrors(fieldErrorsOf(e.issues, FIELDS));
      },
    });
  }

  const general = change.error && !(isApiRequestError(change.error) && change.error.issues.length) ? change.error.message : null;
  return (
    <Card testID="password-card">
      <Text variant="title">Your password</Text>
      <Text variant="small">At least 12 characters. Your other signed-in sessions end when you change it.</Text>
      <View style={{ gap: space.md }}>
        <TextField testID="password-current" label="Current password" secureTextEntry autoComplete="current-password"
          value={form.currentPassword} error={errors.currentPassword}
          onChangeText={(currentPassword) => setForm({ ...form, currentPassword })} />
        <TextField testID="password-new" label="New password" secureTextEntry autoComplete="new-password"
          value={form.newPassword} error={errors.newPassword}
          onChangeText={(newPassword) => setForm({ ...form, newPassword })} />
      </View>
      <Button testID="password-submit" label="Change password" onPress={submit} busy={change.isPending} />
      {done ? <Text testID="password-done" tone="success">Password changed.</Text> : null}
      {general ? <Text tone="danger">{general}</Text> : null}
    </Card>
  );
}
