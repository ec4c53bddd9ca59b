import { useRef } from 'react';
import { Redirect, Slot, useGlobalSearchParams } from 'expo-router';
import { safeReturnPath } from '../../components/auth/return-path';
import { useSession } from '../../components/data/session';

/** Signed-in people have no business on the sign-in page: send them on (to `next` if given). */
export default function AuthLayout() {
  const { status } = useSession();
  const { next } = useGlobalSearchParams<{ next?: string }>();
  // Expo Router on the web may drop the query while it swaps navigators (the same URL
  // rewrite app/(app)/_layout.tsx works around), so keep the last `next` seen.
  const remembered = useRef(next);
  if (next) remembered.current = next;

  if (status === 'signed-in') return <Redirect href={safeReturnPath(remembered.current)} />;
  return <Slot />;
}
