// Page behaviour that needs no round trip to the server:
// - arrow keys inside a [data-nudge-area] move the selected marker instead of scrolling the page;
// - a button with data-copy-from="ID" copies the value of the input ID to the clipboard.
(function () {
  "use strict";
  const arrows = new Set(["ArrowLeft", "ArrowRight", "ArrowUp", "ArrowDown"]);
  document.addEventListener("keydown", function (e) {
    if (arrows.has(e.key) && e.target instanceof Element && e.target.closest("[data-nudge-area]")
        && !(e.target instanceof HTMLInputElement) && !(e.target instanceof HTMLSelectElement)) {
      e.preventDefault();
    }
  });
  document.addEventListener("click", function (e) {
    const button = e.target instanceof Element ? e.target.closest("[data-copy-from]") : null;
    if (!button) {
      return;
    }
    const source = document.getElementById(button.getAttribute("data-copy-from"));
    if (!source) {
      return;
    }
    source.select();
    if (navigator.clipboard && window.isSecureContext) {
      navigator.clipboard.writeText(source.value).then(function () { button.textContent = "Copied"; }, function () { });
    } else {
      button.textContent = "Selected: press Ctrl+C";
    }
  });
})();
