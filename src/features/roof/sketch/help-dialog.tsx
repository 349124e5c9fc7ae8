import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";

/** `or`: the keys are alternatives (shown with "/"), else pressed together (shown with "+"). */
export const SHORTCUTS: { keys: string[]; what: string; or?: boolean }[] = [
  { keys: ["V"], what: "Select tool: click a plane, an edge or a corner" },
  { keys: ["D"], what: "Draw tool: click corners to outline a plane" },
  { keys: ["Shift", "click"], what: "While drawing: keep the new edge east–west or north–south" },
  { keys: ["Enter"], what: "Close the outline being drawn" },
  { keys: ["Backspace"], what: "While drawing: remove the last corner" },
  { keys: ["Esc"], what: "Cancel the outline, or clear the selection" },
  { keys: ["E"], what: "Make the selected edge the plane's eave" },
  { keys: ["Delete"], what: "Delete the selected corner, or the selected plane" },
  { keys: ["←", "↑", "→", "↓"], what: "Move the selected corner by one snap step", or: true },
  { keys: ["Ctrl/⌘", "Z"], what: "Undo" },
  { keys: ["Ctrl/⌘", "Shift", "Z"], what: "Redo (also Ctrl+Y)" },
  { keys: ["Ctrl/⌘", "S"], what: "Save the roof" },
  { keys: ["+", "−"], what: "Zoom in / out (or the mouse wheel)", or: true },
  { keys: ["0"], what: "Fit the roof in view" },
  { keys: ["Space", "drag"], what: "Pan (or drag empty space, or the middle button)" },
  { keys: ["G"], what: "Next snap step: 1 ft, 6 in, 1 in" },
  { keys: ["Alt", "drag"], what: "Move one plane's corner without the corners that share its point" },
  { keys: ["?"], what: "This list" },
];

export function HelpDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Roof sketch: keys and gestures"
      description="Keys work while the focus is not in a text field."
      className="max-w-lg"
      footer={<Button onClick={onClose}>Close</Button>}
    >
      <table className="w-full text-sm">
        <tbody className="divide-y divide-steel-100">
          {SHORTCUTS.map((s) => (
            <tr key={s.what}>
              <td className="whitespace-nowrap py-1.5 pr-3">
                {s.keys.map((k, i) => (
                  <span key={k}>
                    {i > 0 && <span className="px-0.5 text-steel-400">{s.or ? "/" : "+"}</span>}
                    <kbd className="rounded border border-steel-300 bg-steel-50 px-1.5 py-0.5 font-sans text-xs text-steel-800 shadow-sm">{k}</kbd>
                  </span>
                ))}
              </td>
              <td className="py-1.5 text-steel-700">{s.what}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </Dialog>
  );
}
