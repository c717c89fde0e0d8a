// Tells chart components whether their chart is on the screen (or within a screen-quarter of it), so that a chart out
// of sight is redrawn when it comes into view instead of on every change of the design.
const watched = new Map();
let observer = null;

function onEntries(entries) {
  for (const entry of entries) {
    const w = watched.get(entry.target);
    if (w && w.visible !== entry.isIntersecting) {
      w.visible = entry.isIntersecting;
      w.component.invokeMethodAsync("OnVisibility", entry.isIntersecting).catch(() => { });
    }
  }
}

export function watch(id, component) {
  const element = document.getElementById(id);
  if (!element) {
    return;
  }
  observer ??= new IntersectionObserver(onEntries, { rootMargin: "25% 0px" });
  watched.set(element, { component, visible: null });
  observer.observe(element);
}

export function unwatch(id) {
  const element = document.getElementById(id);
  for (const [e, w] of watched) {
    if (e === element || !e.isConnected) {
      observer?.unobserve(e);
      watched.delete(e);
    }
  }
}
