import { useParams, useSearchParams } from "react-router-dom";
import { InvalidLinkPage, ProposalPage } from "@/features/proposal-public/components/proposal-page";
import type { ReturnState } from "@/features/proposal-public/components/deposit-panel";

/** `/p/:token`: public, outside the signed-in shell; the token in the link is the only credential. */
export function ProposalPublicRoute() {
  const { token = "" } = useParams();
  const [params] = useSearchParams();
  const d = params.get("deposit");
  const returned: ReturnState = d === "processing" || d === "cancelled" ? d : null;
  // a token is URL-safe base64: anything else cannot be one, so don't even ask the server
  if (!/^[A-Za-z0-9_-]{16,200}$/.test(token)) return <InvalidLinkPage />;
  return <ProposalPage token={token} returned={returned} />;
}
