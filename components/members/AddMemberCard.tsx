import { useState } from 'react';
import { View } from 'react-native';
import type { Role } from '../../schemas/auth';
import { addMemberRequestSchema, type Member } from '../../schemas/workspace';
import { isApiRequestError } from '../data/api';
import { fieldErrorsOf, issuesOfZodError, type FieldErrors } from '../data/field-errors';
import { useAddMember } from '../data/members';
import { ROLE_LABELS, ROLE_OPTIONS, ROLE_SUMMARIES } from '../roles';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';

const MEMBER_FIELDS = ['email', 'name', 'role'] as const;
type Errors = FieldErrors<(typeof MEMBER_FIELDS)[number]>;

interface Added {
  member: Member;
  initialPassword?: string;
}

/** Owners add a person by e-mail; a new account's password is shown here exactly once. */
export function AddMemberCard({ workspaceId }: { workspaceId: number }) {
  const { colors, radius, space, font } = useTheme();
  const add = useAddMember(workspaceId);
  const [email, setEmail] = useState('');
  const [name, setName] = useState('');
  const [role, setRole] = useState<Role>('engineer');
  const [errors, setErrors] = useState<Errors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [added, setAdded] = useState<Added | null>(null);

  const submit = () => {
    setFormError(null);
    const parsed = addMemberRequestSchema.safeParse({ email, name: name.trim() === '' ? undefined : name, role });
    if (!parsed.success) {
      setErrors(fieldErrorsOf(issuesOfZodError(parsed.error), MEMBER_FIELDS));
      return;
    }
    setErrors({});
    add.mutate(parsed.data, {
      onSuccess: (answer) => {
        setAdded(answer);
        setEmail('');
        setName('');
      },
      onError: (error) => {
        if (isApiRequestError(error, 400)) setErrors(fieldErrorsOf(error.issues, MEMBER_FIELDS));
        setFormError(error.message);
      },
    });
  };

  return (
    <Card testID="member-add" style={{ gap: space.lg }}>
      <View style={{ gap: space.xs }}>
        <Text variant="title">Add a member</Text>
        <Text variant="small">
          Someone without an account gets one with a password shown once, here, for you to pass on.
        </Text>
      </View>

      {added ? (
        <Card tone={added.initialPassword ? 'notice' : 'muted'} testID="member-added" style={{ gap: space.sm }}>
          <Text variant="bodyMedium">
            {added.member.email} joined as {ROLE_LABELS[added.member.role]}.
          </Text>
          {added.initialPassword ? (
            <>
              <Text variant="small" style={{ color: colors.text }}>
                A new account was created. Its one-time password is shown only now: copy it and hand it over in
                person or through a channel you trust. Ask them to change it after signing in.
              </Text>
              <View
                style={{
                  backgroundColor: colors.surface,
                  borderWidth: 1,
                  borderColor: colors.border,
                  borderRadius: radius.md,
                  paddingHorizontal: space.md,
                  paddingVertical: space.sm,
                  alignSelf: 'flex-start',
                  maxWidth: '100%',
                }}
              >
                <Text testID="member-initial-password" selectable style={{ fontFamily: font.mono, fontSize: 16 }}>
                  {added.initialPassword}
                </Text>
              </View>
            </>
          ) : (
            <Text variant="small">They already had an account and can sign in with their own password.</Text>
          )}
          <Button testID="member-added-dismiss" label="Done" kind="secondary" compact onPress={() => setAdded(null)} style={{ alignSelf: 'flex-start' }} />
        </Card>
      ) : null}

      {formError ? (
        <Text testID="member-add-error" tone="danger" accessibilityRole="alert">
          {formError}
        </Text>
      ) : null}

      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.lg }}>
        <View style={{ flexGrow: 1, flexBasis: 240 }}>
          <TextField
            testID="member-add-email"
            label="E-mail"
            value={email}
            onChangeText={(t) => {
              setEmail(t);
              if (errors.email) setErrors((e) => ({ ...e, email: undefined }));
            }}
            error={errors.email}
            autoCapitalize="none"
            autoCorrect={false}
            inputMode="email"
            keyboardType="email-address"
            placeholder="colleague@company.example"
            onSubmitEditing={submit}
          />
        </View>
        <View style={{ flexGrow: 1, flexBasis: 200 }}>
          <TextField
            testID="member-add-name"
            label="Name (optional)"
            value={name}
            onChangeText={setName}
            error={errors.name}
            hint="Used for a new account only"
            onSubmitEditing={submit}
          />
        </View>
      </View>
      <View style={{ gap: space.xs }}>
        <Text variant="label">Role</Text>
        <Segmented testID="member-add-role" accessibilityLabel="Role of the new member" options={ROLE_OPTIONS} value={role} onChange={(next) => setRole(next)} />
        <Text variant="small">{errors.role ?? ROLE_SUMMARIES[role]}</Text>
      </View>
      <Button testID="member-add-submit" label="Add member" onPress={submit} busy={add.isPending} style={{ alignSelf: 'flex-start' }} />
    </Card>
  );
}
