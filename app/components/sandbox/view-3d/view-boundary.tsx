import { Component, type ReactNode } from "react";

/** Keeps the page working when the 3D view cannot start (no WebGL, lost context, a failed chunk). */
export class ViewBoundary extends Component<{ children: ReactNode }, { failed: boolean }> {
  state = { failed: false };

  static getDerivedStateFromError() {
    return { failed: true };
  }

  render() {
    if (this.state.failed) {
      return (
        <div className="flex h-full items-center justify-center p-6 text-center text-sm text-ink-soft" role="note">
          The 3D view could not start in this browser (WebGL may be turned off). The plan, the figures and the
          description below still work.
        </div>
      );
    }
    return this.props.children;
  }
}
