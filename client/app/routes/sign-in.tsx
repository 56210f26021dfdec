import { SignInPanel } from "../../features/auth/components/sign-in-panel.tsx";

export function Component() {
  return <SignInPanel />;
}
