import { GraduationCap } from "lucide-react";
import { encodeSpec } from "~/lib/sheet-link";
import { useSandboxStore } from "~/components/sandbox/state/store";

/**
 * "Make this roof a task": opens /lessons/new with the roof on screen as the task's starting roof
 * (for trainers and admins; the caller decides who sees it). `roofId` links a saved roof instead.
 */
export function MakeTaskLink({ roofId }: { roofId?: string }) {
  const store = useSandboxStore();
  function open(e: React.MouseEvent<HTMLAnchorElement>) {
    if (roofId) return;
    const spec = store.getState().spec;
    e.currentTarget.href = `/lessons/new?spec=${encodeSpec(spec)}`;
  }
  return (
    <a
      className="btn px-2"
      href={roofId ? `/lessons/new?roof=${roofId}` : "/lessons/new"}
      onClick={open}
      data-testid="make-task"
    >
      <GraduationCap size={16} aria-hidden="true" /> Make this roof a task
    </a>
  );
}
