/** Signed-in area: the session gate, then the navigation shell around the screens. */
import { Slot } from 'expo-router';
import { SignedInGate } from '../../components/auth/signed-in-gate';

export default function SignedInLayout() {
  return (
    <SignedInGate>
      <Slot />
    </SignedInGate>
  );
}
