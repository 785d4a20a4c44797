// The start overlay: audio starts only after a click (browser autoplay rules), with the listening-level caution.
import { LISTENING_FLOOR_DB } from '../editor';

/** Shows the overlay; resolves with the chosen volume in dB once the visitor clicks start. */
export function showStartOverlay(host: HTMLElement, initialDb: number): { started: Promise<number>; fail(message: string): void; hide(): void } {
  host.innerHTML = `
    <div class="start-card" role="dialog" aria-labelledby="start-title">
      <h1 id="start-title">Night test range</h1>
      <p>A drone passes at speed, a kart laps the loop, an orb buzzes around you, a generator hums; clicks and a music
      loop play too. Hold <b>Space</b> for slow motion and tune everything in the panel.</p>
      <p class="caution"><b>Listening level:</b> start low. Pitch and speed changes can make sounds louder than you
      expect, especially on headphones. The safety limiter is on.</p>
      <label>Volume <input id="start-volume" type="range" min="${LISTENING_FLOOR_DB}" max="0" step="1" value="${initialDb}"> <span id="start-volume-db">${initialDb} dB</span></label>
      <button id="start-button" type="button">Click to start audio</button>
      <p class="error" id="start-error" hidden></p>
    </div>`;
  const slider = host.querySelector('#start-volume') as HTMLInputElement;
  const readout = host.querySelector('#start-volume-db') as HTMLSpanElement;
  slider.addEventListener('input', () => (readout.textContent = `${slider.value} dB`));
  const button = host.querySelector('#start-button') as HTMLButtonElement;
  const started = new Promise<number>((resolve) => {
    button.addEventListener('click', () => {
      button.disabled = true;
      button.textContent = 'Starting…';
      resolve(Number(slider.value));
    });
  });
  return {
    started,
    fail(message: string) {
      const e = host.querySelector('#start-error') as HTMLParagraphElement;
      e.hidden = false;
      e.textContent = message;
      button.textContent = 'Audio could not start';
    },
    hide() {
      host.classList.add('gone');
    },
  };
}
