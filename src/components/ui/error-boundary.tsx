import { Component, type ErrorInfo, type ReactNode } from "react";
import { Button } from "@/components/ui/button";

type Props = {
  children: ReactNode;
  /** Replaces the default panel; gets the error and a reset function. */
  fallback?: (error: Error, reset: () => void) => ReactNode;
  /** What failed, for the default panel: "The team list". */
  what?: string;
};

type State = { error: Error | null };

/** Catches a render error in one section so the rest of the screen keeps working. */
export class ErrorBoundary extends Component<Props, State> {
  override state: State = { error: null };

  static getDerivedStateFromError(error: Error): State {
    return { error };
  }

  override componentDidCatch(error: Error, info: ErrorInfo) {
    console.error(error, info.componentStack);
  }

  reset = () => this.setState({ error: null });

  override render() {
    const { error } = this.state;
    if (!error) return this.props.children;
    if (this.props.fallback) return this.props.fallback(error, this.reset);
    return (
      <div role="alert" className="rounded-lg border border-danger-200 bg-danger-50 px-4 py-3 text-sm text-danger-700">
        <p className="font-semibold">{this.props.what ?? "This section"} could not be shown.</p>
        <p className="mt-0.5 text-danger-700/90">Try again; if it keeps failing, reload the page.</p>
        <Button variant="secondary" size="sm" className="mt-2" onClick={this.reset}>
          Try again
        </Button>
      </div>
    );
  }
}
