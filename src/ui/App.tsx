/** The workbench shell: title, research-use caution, a load control and the (empty) review area. */
export function App() {
  return (
    <div className="shell">
      <header className="shell-header">
        <h1>Winnow</h1>
        <p className="caution">Research tool — not for clinical diagnosis. Recordings stay on this machine.</p>
      </header>
      <main className="review-area" aria-label="Review area" />
    </div>
  );
}
