import { Component, type ErrorInfo, type ReactNode } from "react";

interface Props {
  children: ReactNode;
}
interface State {
  error: Error | undefined;
}

/** Catches render errors below it so one broken panel never blanks the whole page. */
export class ErrorBoundary extends Component<Props, State> {
  override state: State = { error: undefined };

  static getDerivedStateFromError(error: Error): State {
    return { error };
  }

  override componentDidCatch(error: Error, info: ErrorInfo): void {
    console.error("render error", error, info.componentStack);
  }

  override render() {
    if (this.state.error) {
      return (
        <div role="alert" className="rounded border border-brick/40 bg-brick-wash p-4">
          <p className="font-semibold text-brick">Something on this page failed to render.</p>
          <p className="text-sm text-ink-soft mt-1">{this.state.error.message}</p>
          <button type="button" className="mt-3 text-sm underline text-sea" onClick={() => this.setState({ error: undefined })}>
            Try again
          </button>
        </div>
      );
    }
    return this.props.children;
  }
}
