// The editor's orbit-check node: the shared schema node (lib/dossier/schema.ts) with its
// React view, the call's tolerance, and unique block ids kept through copy and paste.
import { ReactNodeViewRenderer } from "@tiptap/react";
import { Plugin, PluginKey } from "@tiptap/pm/state";
import { OrbitCheckNode } from "@/lib/dossier/schema";
import type { ToleranceInput } from "@/lib/dossier/claims";
import { OrbitCheckView } from "./node-view";

export interface OrbitCheckOptions {
  /** The call's tolerance policy, so live verdicts match what the server will find. */
  tolerance: ToleranceInput | undefined;
}

export const OrbitCheckEditorNode = OrbitCheckNode.extend<OrbitCheckOptions>({
  addOptions() {
    return { tolerance: undefined };
  },
  addNodeView() {
    return ReactNodeViewRenderer(OrbitCheckView);
  },
  addProseMirrorPlugins() {
    return [
      new Plugin({
        key: new PluginKey("orbitCheckIds"),
        appendTransaction: (transactions, _old, state) => {
          if (!transactions.some((t) => t.docChanged)) return null;
          const seen = new Set<string>();
          let tr = state.tr;
          let changed = false;
          state.doc.descendants((node, pos) => {
            if (node.type.name !== this.name) return true;
            const id = node.attrs.blockId as string;
            if (!id || seen.has(id)) {
              const fresh = crypto.randomUUID();
              tr = tr.setNodeMarkup(pos, undefined, { ...node.attrs, blockId: fresh });
              seen.add(fresh);
              changed = true;
            } else seen.add(id);
            return false;
          });
          return changed ? tr : null;
        },
      }),
    ];
  },
});

/** A new block: a circular earth orbit to start from. */
export function newOrbitCheckAttrs() {
  return { blockId: crypto.randomUUID(), label: "", claim: { kind: "orbit", body: "earth", given: {}, claimed: {} }, initialFrom: null };
}
