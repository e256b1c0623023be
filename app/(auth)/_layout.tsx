/** Signed-out area: sign in and sign up; a signed-in visitor is sent into the app. */
import { Slot } from 'expo-router';
import { SignedOutGate } from '../../components/auth/signed-out-gate';

export default function AuthLayout() {
  return (
    <SignedOutGate>
      <Slot />
    </SignedOutGate>
  );
}
