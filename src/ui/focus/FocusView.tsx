/** Focus view of one component (placeholder until the focus panels land). */
export function FocusView() {
  return <section className="focus-view" aria-label="Component focus" />;
}
