/**
 * Accessibility repairs for markup that a library renders and we cannot reach through its props:
 * card headers marked role="heading" without a level, and scroll containers that a keyboard user
 * cannot focus. Runs once at start-up and on every DOM change.
 */
export function installA11yFixups(root: HTMLElement = document.body): MutationObserver {
  const fix = () => {
    root.querySelectorAll<HTMLElement>('[role="heading"]:not([aria-level])').forEach((el) => {
      // The inner title of a card header repeats its parent heading: one heading is enough.
      if (el.parentElement?.closest('[role="heading"]')) el.removeAttribute('role')
      else el.setAttribute('aria-level', '2')
    })
    // Number inputs' step buttons carry only an icon.
    root.querySelectorAll<HTMLElement>('.n-input-number').forEach((box) => {
      const buttons = box.querySelectorAll<HTMLElement>('.n-input__suffix button:not([aria-label]), .n-input__prefix button:not([aria-label])')
      buttons.forEach((b) => b.setAttribute('aria-label', b.classList.contains('n-input-number-button--minus') || b === buttons[0] ? 'Decrease' : 'Increase'))
    })
    // Check boxes without visible text (table row selection) point at a label that is not there.
    root
      .querySelectorAll<HTMLElement>('[role="checkbox"][aria-labelledby], [role="switch"][aria-labelledby], [role="radio"][aria-labelledby]')
      .forEach((el) => {
        const id = el.getAttribute('aria-labelledby')
        if (id && !document.getElementById(id) && !el.hasAttribute('aria-label')) {
          const row = el.closest('tr')
          el.setAttribute('aria-label', row ? `Select: ${(row.textContent ?? '').trim().slice(0, 60)}` : 'Select all')
        }
      })
    root.querySelectorAll<HTMLElement>('.n-data-table .n-scrollbar-container:not([tabindex]), .v-x-scroll:not([tabindex])').forEach((el) => {
      if (el.scrollWidth > el.clientWidth || el.scrollHeight > el.clientHeight) {
        el.setAttribute('tabindex', '0')
        el.setAttribute('aria-label', 'Table (scrolls)')
        el.setAttribute('role', 'region')
      }
    })
  }
  let scheduled = false
  const observer = new MutationObserver(() => {
    if (scheduled) return
    scheduled = true
    requestAnimationFrame(() => {
      scheduled = false
      fix()
    })
  })
  observer.observe(root, { childList: true, subtree: true })
  fix()
  return observer
}
