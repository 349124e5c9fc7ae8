import { DevMailScreen } from "@/features/dev-mail/components/dev-mail-screen";

/** `/dev/mail` (owners and estimators): the local mail catcher's inbox. */
export function DevMailRoute() {
  return <DevMailScreen />;
}
