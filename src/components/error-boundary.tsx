import { Component, type ReactNode } from 'react';

/** Keeps one broken screen from blanking the app; offers a reload. */
export class ErrorBoundary extends Component<{ children: ReactNode }, { error: Error | null }> {
  state = { error: null as Error | null };
  static getDerivedStateFromError(error: Error) {
    return { error };
  }
  render() {
    if (!this.state.error) return this.props.children;
    return (
      <div role="alert" className="card m-4 max-w-xl space-y-3 p-5">
        <h2 className="text-2xl font-bold">This screen hit a problem</h2>
        <p>Nothing you saved is lost. Reload to try again; if it keeps happening, tell your admin what you were doing.</p>
        <pre className="overflow-auto text-sm text-graphite-2">{this.state.error.message}</pre>
        <button className="btn-primary" onClick={() => location.reload()}>
          Reload
        </button>
      </div>
    );
  }
}
