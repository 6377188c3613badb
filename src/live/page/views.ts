import type { FindingRow, PartInfo } from '../model.js';
import type { SvgView } from '../views.js';
import { num, s } from './dom.js';

type Box = [number, number, number, number];

const boxText = (b: readonly number[]): string => b.map((x) => Math.round(x * 1000) / 1000).join(' ');

/**
 * One picture with its own zoom: the model's view box is "home"; the wheel zooms about the pointer,
 * a drag pans, and with the picture focused the keys + − and the arrows zoom and pan, 0 goes home.
 * A zoom the user made is kept when a new model of the same picture arrives.
 */
export class Viewer {
  readonly svg: SVGSVGElement;
  private home: Box = [0, 0, 1, 1];
  private box: Box = [0, 0, 1, 1];
  private zoomed = false;
  private readonly markers: SVGGElement;
  private readonly content: SVGGElement;

  constructor(
    readonly id: string,
    label: string,
  ) {
    this.svg = s('svg', { class: 'view', role: 'img', 'aria-label': label, tabindex: '0', 'data-view': id, preserveAspectRatio: 'xMidYMid meet' });
    this.content = s('g', { class: 'content' });
    this.markers = s('g', { class: 'markers' });
    this.svg.append(this.content, this.markers);
    this.svg.addEventListener('wheel', (e) => this.onWheel(e), { passive: false });
    this.svg.addEventListener('keydown', (e) => this.onKey(e));
    this.svg.addEventListener('pointerdown', (e) => this.onDrag(e));
  }

  show(view: SvgView): void {
    const home: Box = [view.viewBox[0], view.viewBox[1], view.viewBox[2], view.viewBox[3]];
    const sameSize = Math.abs(home[2] - this.home[2]) < 1e-6 && Math.abs(home[3] - this.home[3]) < 1e-6;
    this.home = home;
    if (!this.zoomed || !sameSize) {
      this.box = [...home];
      this.zoomed = false;
    }
    this.content.innerHTML = view.markup;
    this.apply();
  }

  private apply(): void {
    this.svg.setAttribute('viewBox', boxText(this.box));
    // Markers and labels keep their size on screen whatever the zoom.
    this.svg.style.setProperty('--unit', String(this.box[2] / 100));
  }

  fit(): void {
    this.box = [...this.home];
    this.zoomed = false;
    this.apply();
  }

  /** Zoom so that a square of `sizeMm` about `at` fills the picture. */
  zoomTo(at: readonly [number, number], sizeMm: number): void {
    const aspect = this.home[3] / this.home[2];
    const w = sizeMm;
    const hgt = sizeMm * aspect;
    this.box = [at[0] - w / 2, at[1] - hgt / 2, w, hgt];
    this.zoomed = true;
    this.apply();
  }

  /** The zoom a finding asks for: a fifth of the picture, at least 24 mm. */
  zoomToFinding(at: readonly [number, number]): void {
    this.zoomTo(at, Math.max(24, this.home[2] / 5));
  }

  get viewBox(): Box {
    return [...this.box];
  }

  private scale(factor: number, about: readonly [number, number]): void {
    const [x, y, w, hgt] = this.box;
    const nw = Math.min(this.home[2] * 4, Math.max(2, w * factor));
    const k = nw / w;
    this.box = [about[0] - (about[0] - x) * k, about[1] - (about[1] - y) * k, nw, hgt * k];
    this.zoomed = true;
    this.apply();
  }

  private centre(): [number, number] {
    return [this.box[0] + this.box[2] / 2, this.box[1] + this.box[3] / 2];
  }

  private toView(e: MouseEvent): [number, number] {
    const r = this.svg.getBoundingClientRect();
    const k = Math.max(this.box[2] / r.width, this.box[3] / r.height);
    const cx = this.box[0] + this.box[2] / 2;
    const cy = this.box[1] + this.box[3] / 2;
    return [cx + (e.clientX - r.left - r.width / 2) * k, cy + (e.clientY - r.top - r.height / 2) * k];
  }

  private onWheel(e: WheelEvent): void {
    e.preventDefault();
    this.scale(e.deltaY > 0 ? 1.2 : 1 / 1.2, this.toView(e));
  }

  private onKey(e: KeyboardEvent): void {
    const step = this.box[2] / 10;
    const moves: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
    if (e.key === '+' || e.key === '=') this.scale(1 / 1.25, this.centre());
    else if (e.key === '-') this.scale(1.25, this.centre());
    else if (e.key === '0') this.fit();
    else if (moves[e.key]) {
      this.box = [this.box[0] + moves[e.key][0], this.box[1] + moves[e.key][1], this.box[2], this.box[3]];
      this.zoomed = true;
      this.apply();
    } else return;
    e.preventDefault();
    e.stopPropagation();
  }

  private onDrag(e: PointerEvent): void {
    if (e.button !== 0) return;
    const startBox = [...this.box] as Box;
    let moved = false;
    const move = (ev: PointerEvent): void => {
      const r = this.svg.getBoundingClientRect();
      const k = Math.max(startBox[2] / r.width, startBox[3] / r.height);
      const dx = (ev.clientX - e.clientX) * k;
      const dy = (ev.clientY - e.clientY) * k;
      if (!moved && Math.hypot(ev.clientX - e.clientX, ev.clientY - e.clientY) < 4) return;
      moved = true;
      this.box = [startBox[0] - dx, startBox[1] - dy, startBox[2], startBox[3]];
      this.zoomed = true;
      this.apply();
    };
    const up = (): void => {
      window.removeEventListener('pointermove', move);
      window.removeEventListener('pointerup', up);
    };
    window.addEventListener('pointermove', move);
    window.addEventListener('pointerup', up);
  }

  /** Numbered markers for findings; `selected` is drawn larger and ringed. */
  markFindings(items: ReadonlyArray<{ f: FindingRow; at: readonly [number, number] }>, selected: number | null, onPick: (id: number) => void): void {
    this.markers.replaceChildren();
    for (const { f, at } of items) {
      const g = s('g', { class: `marker sev-${f.severity}${f.id === selected ? ' selected' : ''}`, 'data-finding': String(f.id), transform: `translate(${num(at[0], 3)} ${num(at[1], 3)})` });
      const title = s('title');
      title.textContent = `${f.rule}: ${f.message}`;
      g.append(s('circle', { class: 'dot' }), s('text', { class: 'label' }), title);
      (g.querySelector('text') as SVGTextElement).textContent = String(f.id + 1);
      g.addEventListener('click', (e) => {
        e.stopPropagation();
        onPick(f.id);
      });
      this.markers.append(g);
    }
  }
}

/** A small floating box that names the part under the pointer (or the focused part card). */
export class PartTip {
  constructor(
    private readonly el: HTMLElement,
    private parts: readonly PartInfo[] = [],
  ) {}

  setParts(parts: readonly PartInfo[]): void {
    this.parts = parts;
  }

  /** Follow the pointer over any element carrying `data-part` inside `root`. */
  attach(root: HTMLElement): void {
    root.addEventListener('pointerover', (e) => {
      const t = (e.target as Element).closest('[data-part]');
      if (t) this.showFor(t.getAttribute('data-part') ?? '', e.clientX, e.clientY);
    });
    root.addEventListener('pointermove', (e) => {
      if (!this.el.hidden) this.place(e.clientX, e.clientY);
    });
    root.addEventListener('pointerout', (e) => {
      const to = (e.relatedTarget as Element | null)?.closest?.('[data-part]');
      if (!to) this.hide();
    });
  }

  showFor(name: string, x: number, y: number): void {
    const p = this.parts.find((q) => q.name === name);
    if (!p) return this.hide();
    this.el.textContent = `${p.name} — ${num(p.thicknessMm, 1)} mm ${p.material}, ${num(p.massG, 1)} g each, ×${p.quantity}`;
    this.el.hidden = false;
    this.place(x, y);
  }

  private place(x: number, y: number): void {
    this.el.style.left = `${Math.min(x + 14, window.innerWidth - this.el.offsetWidth - 8)}px`;
    this.el.style.top = `${Math.min(y + 14, window.innerHeight - this.el.offsetHeight - 8)}px`;
  }

  hide(): void {
    this.el.hidden = true;
  }
}
