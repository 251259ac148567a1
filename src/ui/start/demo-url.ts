/**
 * Whether the page should open the demo participant by itself: `?demo=1` asks for it; the dev server
 * (`npm start`) opens it unless `?demo=0`; a built site shows the start screen.
 */
export function shouldOpenDemo(search: string, dev: boolean): boolean {
  const demo = new URLSearchParams(search).get('demo');
  if (demo === '1' || demo === 'true') return true;
  if (demo === '0' || demo === 'false') return false;
  return dev;
}
