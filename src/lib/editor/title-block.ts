/**
 * What every output of a plan carries besides the drawing (the printed sheet, the exported PNG): the
 * title, the camera settings, and for each light its power, guide number, modifier, distance to the
 * subject and height. `titleBlock` draws them in the corner of a plan image, as on a technical drawing.
 */
import { formatDistance, formatFNumber, formatGuideNumber, formatShutter, roundSig, type UnitSystem } from '$lib/light/format';
import type { ExposureScene } from '$lib/light/schema';
import { fittedTo } from './model/fitted';
import { formatPower } from './model/power-notation';

export interface LightRow {
	id: string;
	name: string;
	kind: 'flash' | 'continuous' | 'reflector';
	/** In the trade's notation (`1/8 +0.3`), a continuous light's output, a card's reflectance. */
	power: string;
	guideNumber: string | null;
	modifier: string | null;
	distance: string;
	height: string;
}

/** What the plan knows of a light beyond the scene: its label and its modifier's name. */
export type PlanNames = Record<string, { label?: string; modifier?: { name: string } | null } | undefined>;

/**
 * A stored plan's names for the lights table: each element's label and, for a light, its modifier's name,
 * whether the light carries it (`modifier`) or a modifier or diffuser element is fitted to it (`attachedTo`).
 */
export function planNames(plan: { elements?: Record<string, Record<string, unknown>> }): PlanNames {
	const entries = plan.elements ?? {};
	const text = (v: unknown) => (typeof v === 'string' && v.trim() ? v.trim() : null);
	return Object.fromEntries(
		Object.entries(entries).map(([id, el]) => {
			const name = text((el.modifier as { name?: unknown } | null | undefined)?.name) ?? text(fittedTo(entries, id)?.label);
			return [id, { label: text(el.label) ?? id, modifier: name ? { name } : null }];
		})
	);
}

export function lightRows(scene: ExposureScene, plan: PlanNames, system: UnitSystem): LightRow[] {
	const s = scene.subject.position;
	return scene.lights.map((light) => {
		const p = light.position;
		const named = plan[light.id];
		const power =
			light.kind === 'flash'
				? formatPower(light.power)
				: light.kind === 'continuous'
					? `${roundSig(light.luxAt1m, 3)} lx at 1 m`
					: `reflects ${Math.round(light.reflectance * 100)} %`;
		return {
			id: light.id,
			name: named?.label || light.id,
			kind: light.kind,
			power,
			guideNumber: light.kind === 'flash' ? formatGuideNumber(light.guideNumber, system) : null,
			modifier: named?.modifier?.name ?? null,
			distance: formatDistance(Math.hypot(p[0] - s[0], p[1] - s[1], p[2] - s[2]), system),
			height: formatDistance(p[2], system)
		};
	});
}

const ratio = (m: number) => (m <= 0 ? 'not close-up' : m >= 1 ? `${roundSig(m, 3)}:1` : `1:${roundSig(1 / m, 3)}`);

/** `ISO 100 · f/16 · 1/160 s · 0.5× (1:2)` */
export function cameraLine(camera: ExposureScene['camera']): string {
	return `ISO ${camera.iso} · ${formatFNumber(camera.aperture)} · ${formatShutter(camera.shutter)} · ${roundSig(camera.magnification, 3)}× (${ratio(camera.magnification)})`;
}

/** One line a light: `Key flash: flash 1/8, GN 40 (m), small softbox, 32.0 cm away, 25.0 cm high`. */
export function lightLine(r: LightRow): string {
	return [`${r.name}: ${r.kind} ${r.power}`, r.guideNumber ? `GN ${r.guideNumber}` : null, r.modifier, `${r.distance} away`, `${r.height} high`].filter(Boolean).join(', ');
}

/**
 * The plan image with a title block below its bottom-right corner (the drawing is never covered):
 * the title, the camera settings and one line a light, in the light theme's ink on its paper.
 */
export function titleBlock(plan: HTMLCanvasElement, lines: { title: string; camera: string; lights: string[] }, pixelRatio: number, paper = '#f7f5f0', ink = '#171b1f'): HTMLCanvasElement {
	const pad = 8 * pixelRatio;
	const line = 15 * pixelRatio;
	const rows = [lines.camera, ...lines.lights];
	const probe = document.createElement('canvas').getContext('2d')!;
	probe.font = `${11 * pixelRatio}px "Work Sans", system-ui, sans-serif`;
	const textWidth = Math.max(...rows.map((r) => probe.measureText(r).width), probe.measureText(lines.title).width * 1.2);
	const blockW = Math.min(plan.width, textWidth + 2 * pad);
	const blockH = pad * 2 + line * (rows.length + 1.2);
	const out = document.createElement('canvas');
	out.width = plan.width;
	out.height = plan.height + blockH + pad;
	const g = out.getContext('2d')!;
	g.fillStyle = paper;
	g.fillRect(0, 0, out.width, out.height);
	g.drawImage(plan, 0, 0);
	const x0 = out.width - blockW - pad / 2;
	const y0 = plan.height + pad / 2;
	g.strokeStyle = ink;
	g.lineWidth = 1.6 * pixelRatio;
	g.strokeRect(x0, y0, blockW, blockH);
	g.lineWidth = 0.8 * pixelRatio;
	g.beginPath();
	g.moveTo(x0, y0 + pad + line * 1.3);
	g.lineTo(x0 + blockW, y0 + pad + line * 1.3);
	g.stroke();
	g.fillStyle = ink;
	g.textBaseline = 'top';
	g.font = `600 ${13 * pixelRatio}px "Work Sans", system-ui, sans-serif`;
	g.fillText(lines.title, x0 + pad, y0 + pad, blockW - 2 * pad);
	g.font = `${11 * pixelRatio}px "Work Sans", system-ui, sans-serif`;
	rows.forEach((r, i) => g.fillText(r, x0 + pad, y0 + pad + line * (1.5 + i), blockW - 2 * pad));
	return out;
}

/** What the title block needs of a plan as the editor holds it. */
export interface TitledPlan {
	readonly elements: readonly { id: string; label: string; modifier?: { name: string } | null }[];
	readonly scene: ExposureScene;
	readonly unitSystem: UnitSystem;
}

/**
 * The plan's canvas with its title block: the title, the camera settings and one line a light of the
 * plan (the printed sheet, Export PNG and `PlanFigure`'s print image all take it from here).
 */
export function planWithTitleBlock(canvas: HTMLCanvasElement, plan: TitledPlan, title: string, pixelRatio: number): HTMLCanvasElement {
	const names = Object.fromEntries(plan.elements.map((el) => [el.id, { label: el.label, modifier: el.modifier ?? null }]));
	const lights = lightRows(plan.scene, names, plan.unitSystem).map(lightLine);
	return titleBlock(canvas, { title, camera: cameraLine(plan.scene.camera), lights }, pixelRatio);
}
