// On-screen help for the fly camera and slow motion.

/** Fills the help box; H toggles it. */
export function showHelp(host: HTMLElement): void {
  host.innerHTML = `
    <b>Controls</b> · <kbd>H</kbd> hides this<br>
    <kbd>W</kbd><kbd>A</kbd><kbd>S</kbd><kbd>D</kbd> or arrows move · <kbd>Q</kbd>/<kbd>E</kbd> down/up · hold <kbd>Shift</kbd> faster<br>
    click the view for mouse look · <kbd>Esc</kbd> releases the mouse<br>
    hold <kbd>Space</kbd> slow motion · <kbd>T</kbd> toggles it · <kbd>C</kbd> interface click`;
  window.addEventListener('keydown', (e) => {
    if (e.code === 'KeyH' && !(e.target instanceof HTMLInputElement)) host.classList.toggle('hidden');
  });
}
