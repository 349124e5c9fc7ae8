import { errorMessage } from "@/lib/api-client";
import { Alert } from "./alert";
import { Button } from "./button";

type Props = {
  /** What could not be loaded, e.g. "The quote could not be loaded". */
  title: string;
  /** The query's error: its message is shown in words. */
  error: unknown;
  onRetry: () => void;
};

/** A read that failed: what, the reason in words, and a button to try again. */
export function LoadFailed({ title, error, onRetry }: Props) {
  return (
    <Alert tone="error" title={title}>
      <p>{errorMessage(error)}</p>
      <Button variant="secondary" size="sm" className="mt-2" onClick={onRetry}>
        Try again
      </Button>
    </Alert>
  );
}
