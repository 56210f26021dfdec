import { ForbiddenPanel } from "../../features/auth/components/forbidden-panel.tsx";

export function Component() {
  return <ForbiddenPanel />;
}
