import type { FormField, FormSection } from '../form.js';
import type { Problem } from '../model.js';
import { fill, h } from './dom.js';

/** What the form asks of the page: send one field's new text (null: back to the default). */
export type EditSink = (path: string, text: string | null) => void;

type Control = HTMLInputElement | HTMLSelectElement;

const inputId = (path: string): string => `f-${path}`;

/** Arrow-key step for a number field: fine for small ranges, coarse for long ones. */
function stepFor(f: FormField): string {
  if (f.integer) return '1';
  const span = f.min !== null && f.max !== null ? f.max - f.min : 100;
  return span <= 1 ? '0.01' : span <= 20 ? '0.1' : '0.5';
}

/** Sections start open when they hold values the file sets; rule limits and absent sections start closed. */
const startsOpen = (sec: FormSection, depth: number): boolean => sec.present && !(depth === 0 && sec.path === 'checks') && !(depth > 0 && sec.path.startsWith('checks.'));

/**
 * The generated form. It is rebuilt only when the set of fields changes (a kind or a list item added),
 * so the field being edited keeps its focus and caret while models come and go.
 */
export class FormView {
  private signature = '';
  private readonly controls = new Map<string, Control>();
  private readonly fields = new Map<string, FormField>();
  private readonly errors = new Map<string, HTMLElement>();
  private readonly sectionErrors = new Map<string, HTMLElement>();
  private readonly timers = new Map<string, number>();
  private filterText = '';

  constructor(
    private readonly root: HTMLElement,
    private readonly banner: HTMLElement,
    private readonly send: EditSink,
  ) {}

  /**
   * Show the model's form; fields with edits not yet saved keep the text the user typed, and so
   * does the focused field unless `force` (edits discarded) says the model's value wins.
   */
  render(sections: readonly FormSection[], pending: ReadonlyMap<string, string | null>, force = false): void {
    const all = sections.flatMap(function collect(s: FormSection): FormField[] {
      return [...s.fields, ...s.sections.flatMap(collect)];
    });
    const signature = all.map((f) => `${f.path}:${f.input}`).join('|');
    if (signature !== this.signature) this.build(sections);
    this.signature = signature;
    for (const f of all) {
      this.fields.set(f.path, f);
      const c = this.controls.get(f.path);
      if (!c) continue;
      const wanted = pending.has(f.path) ? (pending.get(f.path) ?? '') : f.text;
      const holder = c.closest('.field');
      holder?.classList.toggle('pending', pending.has(f.path));
      holder?.classList.toggle('absent', !f.present);
      if (!force && document.activeElement === c && !pending.has(f.path) && c.value !== f.text && c instanceof HTMLInputElement && c.type !== 'checkbox') {
        // The user is typing here; the model's value lands when they leave the field.
        continue;
      }
      if (c instanceof HTMLInputElement && c.type === 'checkbox') c.checked = (wanted || f.defaultText) === 'true';
      else if (c.value !== wanted) c.value = wanted;
    }
  }

  private build(sections: readonly FormSection[]): void {
    const focused = document.activeElement instanceof HTMLElement ? document.activeElement.id : '';
    this.controls.clear();
    this.errors.clear();
    this.sectionErrors.clear();
    const filter = h('input', { type: 'search', id: 'form-filter', placeholder: 'filter fields (/)', 'aria-label': 'filter the fields', value: this.filterText, oninput: (e: Event) => this.applyFilter((e.target as HTMLInputElement).value) });
    fill(this.root, filter, ...sections.map((s) => this.section(s, 0)));
    this.applyFilter(this.filterText);
    if (focused) document.getElementById(focused)?.focus();
  }

  private section(sec: FormSection, depth: number): HTMLElement {
    const err = h('p', { class: 'error', role: 'alert', hidden: true });
    this.sectionErrors.set(sec.path, err);
    const details = h(
      'details',
      { class: `section depth-${depth}`, 'data-path': sec.path, ...(startsOpen(sec, depth) ? { open: true } : {}) },
      h('summary', {}, sec.title, sec.present ? null : h('span', { class: 'absent-note' }, ' (defaults)')),
      sec.description ? h('p', { class: 'section-description' }, sec.description) : null,
      err,
      ...sec.fields.map((f) => this.field(f)),
      ...sec.sections.map((s) => this.section(s, depth + 1)),
    );
    return details;
  }

  private field(f: FormField): HTMLElement {
    const id = inputId(f.path);
    let control: Control;
    if (f.input === 'select') {
      control = h('select', { id, name: f.path }, ...(f.required || f.present ? [] : [h('option', { value: '' }, `default (${f.defaultText})`)]), ...f.options.map((o) => h('option', { value: o }, o)));
      control.addEventListener('change', () => this.send(f.path, control.value === '' ? null : control.value));
    } else if (f.input === 'checkbox') {
      control = h('input', { id, name: f.path, type: 'checkbox' });
      control.addEventListener('change', () => this.send(f.path, String((control as HTMLInputElement).checked)));
    } else {
      const isNumber = f.input === 'number';
      control = h('input', {
        id,
        name: f.path,
        type: isNumber ? 'number' : 'text',
        ...(isNumber ? { step: stepFor(f), inputmode: 'decimal' } : { spellcheck: 'false', autocomplete: 'off' }),
        ...(isNumber && f.min !== null ? { min: f.min } : {}),
        ...(isNumber && f.max !== null ? { max: f.max } : {}),
        placeholder: f.defaultText ? `default ${f.defaultText}` : f.required ? 'required' : '',
        ...(f.options.length ? { list: `${id}-options` } : {}),
      });
      const input = control as HTMLInputElement;
      const commit = (): void => this.send(f.path, input.value.trim() === '' ? null : input.value);
      input.addEventListener('change', commit);
      // Arrow keys and the spin buttons change the number without typing: follow them at once.
      input.addEventListener('input', (e) => {
        if ((e as InputEvent).inputType) return;
        window.clearTimeout(this.timers.get(f.path));
        this.timers.set(f.path, window.setTimeout(commit, 120));
      });
    }
    control.setAttribute('aria-describedby', `${id}-hint ${id}-error`);
    this.controls.set(f.path, control);
    const err = h('p', { class: 'error', id: `${id}-error`, role: 'alert', hidden: true });
    this.errors.set(f.path, err);
    const reset = !f.required
      ? h('button', { type: 'button', class: 'reset', title: `remove ${f.key} from the file (the default applies)`, 'aria-label': `reset ${f.label} to the default`, onclick: () => this.send(f.path, null) }, '↺')
      : null;
    const hint = [f.description, f.range ? `${f.range}` : '', f.defaultText ? `default ${f.defaultText}${f.unit && f.input === 'number' ? ` ${f.unit}` : ''}` : ''].filter(Boolean).join(' · ');
    return h(
      'div',
      { class: 'field', 'data-path': f.path },
      h('label', { for: id }, f.label, f.unit ? h('span', { class: 'unit' }, ` ${f.unit}`) : null, f.required ? h('span', { class: 'req', title: 'required' }, ' *') : null),
      h('div', { class: 'control' }, control, reset),
      f.options.length && f.input === 'text' ? h('datalist', { id: `${id}-options` }, ...f.options.map((o) => h('option', { value: o }))) : null,
      h('p', { class: 'hint', id: `${id}-hint` }, hint),
      err,
    );
  }

  private applyFilter(text: string): void {
    this.filterText = text;
    const q = text.trim().toLowerCase();
    for (const el of this.root.querySelectorAll<HTMLElement>('.field')) {
      const f = this.fields.get(el.dataset.path ?? '');
      const hay = `${f?.label ?? ''} ${f?.path ?? ''} ${f?.description ?? ''}`.toLowerCase();
      el.hidden = q !== '' && !hay.includes(q);
    }
    if (q !== '') for (const d of this.root.querySelectorAll('details')) d.open = true;
  }

  /** Put each problem next to its field (or the nearest section that holds its path, or the banner). */
  showProblems(problems: readonly Problem[]): void {
    this.clearProblems();
    const loose: string[] = [];
    for (const p of problems) {
      const text = `${p.value && p.value !== '(missing)' ? `${p.value} ` : ''}${p.message}`;
      const fieldPath = [...this.errors.keys()].filter((k) => p.path === k || p.path.startsWith(`${k}.`)).sort((a, b) => b.length - a.length)[0];
      const target = fieldPath !== undefined ? this.errors.get(fieldPath) : [...this.sectionErrors.entries()].filter(([k]) => k !== '' && (p.path === k || p.path.startsWith(`${k}.`))).sort((a, b) => b[0].length - a[0].length)[0]?.[1];
      if (target) {
        target.hidden = false;
        target.textContent = target.textContent ? `${target.textContent}; ${text}` : text;
        target.closest('.field')?.classList.add('invalid');
        for (let d = target.closest('details'); d; d = d.parentElement?.closest('details') ?? null) d.open = true;
      } else {
        loose.push(`${p.path || 'design'}: ${text}`);
      }
    }
    if (loose.length) {
      this.banner.hidden = false;
      this.banner.textContent = loose.join('\n');
    }
  }

  clearProblems(): void {
    for (const e of [...this.errors.values(), ...this.sectionErrors.values()]) {
      e.hidden = true;
      e.textContent = '';
    }
    for (const el of this.root.querySelectorAll('.invalid')) el.classList.remove('invalid');
    this.banner.hidden = true;
    this.banner.textContent = '';
  }

  /** Move the keyboard focus to the first field that has a problem. */
  focusFirstProblem(): void {
    const first = this.root.querySelector<HTMLElement>('.field.invalid input, .field.invalid select');
    first?.focus();
  }

  focusFilter(): void {
    document.getElementById('form-filter')?.focus();
  }
}
