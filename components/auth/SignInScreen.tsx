import { useRef, useState } from 'react';
import Head from 'expo-router/head';
import { KeyboardAvoidingView, Platform, Pressable, ScrollView, TextInput, View } from 'react-native';
import { loginRequestSchema, type LoginRequest } from '../../schemas/auth';
import { isApiRequestError } from '../data/api';
import { fieldErrorsOf, issuesOfZodError, type FieldErrors } from '../data/field-errors';
import { useSignIn } from '../data/session';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { MarkIcon } from '../ui/icons';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';


export const DEMO_ACCOUNTS = [
  { email: 'owner@example.com', role: 'Owner' },
  { email: 'engineer@example.com', role: 'Engineer' },
  { email: 'reviewer@example.com', role: 'Reviewer' },
  { email: 'viewer@example.com', role: 'Viewer' },
] as const;
export const DEMO_PASSWORD = 'samplewright-demo';

const LOGIN_FIELDS = ['email', 'password'] as const;

/** The (auth) layout sends a signed-in user on (see app/(auth)/_layout.tsx). */
export function SignInScreen() {
  const { colors, radius, space, font } = useTheme();
  const signIn = useSignIn();
  const passwordRef = useRef<TextInput>(null);
  const [form, setForm] = useState<LoginRequest>({ email: '', password: '' });
  const [fieldErrors, setFieldErrors] = useState<FieldErrors<keyof LoginRequest>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const update = (key: keyof LoginRequest) => (text: string) => {
    setForm((f) => ({ ...f, [key]: text }));
    if (fieldErrors[key]) setFieldErrors((e) => ({ ...e, [key]: undefined }));
  };

  const submit = () => {
    setFormError(null);
    const parsed = loginRequestSchema.safeParse(form);
    if (!parsed.success) {
      setFieldErrors(fieldErrorsOf(issuesOfZodError(parsed.error), LOGIN_FIELDS));
      return;
    }
    setFieldErrors({});
    signIn.mutate(parsed.data, {
      onError: (error) => {
        if (isApiRequestError(error, 400) && error.issues.length > 0) setFieldErrors(fieldErrorsOf(error.issues, LOGIN_FIELDS));
        setFormError(error.message);
      },
    });
  };

  return (
    <KeyboardAvoidingView behavior={Platform.OS === 'ios' ? 'padding' : undefined} style={{ flex: 1, backgroundColor: colors.background }}>
      <Head>
        <title>Sign in · Samplewright</title>
      </Head>
      <ScrollView contentContainerStyle={{ flexGrow: 1, justifyContent: 'center', padding: space.lg }}>
        <View style={{ width: '100%', maxWidth: 420, alignSelf: 'center', gap: space.xl, paddingVertical: space.xl }}>
          <View style={{ alignItems: 'center', gap: space.md }}>
            <MarkIcon size={48} color={colors.primary} accent="#f3c969" />
            <View style={{ alignItems: 'center', gap: space.xs }}>
              <Text variant="heading">Samplewright</Text>
              <Text tone="textMuted" style={{ textAlign: 'center' }}>
                From an analog compensator to reviewed fixed‑point C.
              </Text>
            </View>
          </View>

          <Card style={{ padding: space.xl, gap: space.lg }}>
            <Text variant="title" accessibilityRole="header">
              Sign in
            </Text>
            {formError ? (
              <View
                testID="signin-error"
                accessibilityRole="alert"
                style={{ backgroundColor: '#fcefee', borderColor: '#ebc2bf', borderWidth: 1, borderRadius: radius.md, padding: space.md }}
              >
                <Text tone="danger">{formError}</Text>
              </View>
            ) : null}
            <TextField
              testID="signin-email"
              label="E-mail"
              value={form.email}
              onChangeText={update('email')}
              error={fieldErrors.email}
              autoCapitalize="none"
              autoCorrect={false}
              autoComplete="email"
              inputMode="email"
              keyboardType="email-address"
              returnKeyType="next"
              onSubmitEditing={() => passwordRef.current?.focus()}
              placeholder="you@company.example"
            />
            <TextField
              ref={passwordRef}
              testID="signin-password"
              label="Password"
              value={form.password}
              onChangeText={update('password')}
              error={fieldErrors.password}
              secureTextEntry
              autoComplete="current-password"
              returnKeyType="go"
              onSubmitEditing={submit}
            />
            <Button testID="signin-submit" label="Sign in" onPress={submit} busy={signIn.isPending} />
          </Card>

          <Card tone="muted" testID="demo-hint" style={{ gap: space.sm }}>
            <Text variant="label">Demo accounts</Text>
            <Text variant="small">
              Each has the password <Text variant="small" style={{ fontFamily: font.mono, color: colors.text }}>{DEMO_PASSWORD}</Text>.
              Tap one to fill in the form.
            </Text>
            <View style={{ gap: 2 }}>
              {DEMO_ACCOUNTS.map((account) => (
                <Pressable
                  key={account.email}
                  testID={`demo-${account.role.toLowerCase()}`}
                  accessibilityRole="button"
                  accessibilityLabel={`Fill in ${account.email}`}
                  onPress={() => {
                    setForm({ email: account.email, password: DEMO_PASSWORD });
                    setFieldErrors({});
                    setFormError(null);
                  }}
                  style={{ flexDirection: 'row', justifyContent: 'space-between', paddingVertical: 6 }}
                >
                  <Text variant="small" style={{ fontFamily: font.mono, color: colors.primary }}>
                    {account.email}
                  </Text>
                  <Text variant="small">{account.role}</Text>
                </Pressable>
              ))}
            </View>
          </Card>
        </View>
      </ScrollView>
    </KeyboardAvoidingView>
  );
}
