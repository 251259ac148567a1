/** Before/after preview of the cleaned signal (placeholder until the preview lands). */
export function PreviewView() {
  return <section className="preview-view" aria-label="Cleaned signal preview" />;
}
