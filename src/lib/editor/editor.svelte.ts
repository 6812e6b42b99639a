/**
 * The plan editor's client state: the model (the setup's scene and plan), its undo history, and the
 * session state that is never saved (selection, zoom and pan, the active tool, snapping, the falloff
 * map switch). Inputs from the stage go to the active tool; every change to the model goes through a
 * command. One instance per editor page, handed down with `setEditorContext`; call `destroy()` when
 * the page goes.
 */
import { formatDistance, type UnitSystem } from '$lib/light/format';
import type { ExposureScene } from '$lib/light/schema';
import * as commands from './commands';
import type { Command, CommandError, CommandResult } from './commands';
import { falloffGrid, type FalloffGrid } from './falloff';
import { FalloffService } from './falloff-service.svelte';
import { gridLines, gridSteps, scaleBar } from './grid';
import { HIT_MARGIN_PX, ROTATION_HANDLE_HIT_PX, rotationHandlePosition } from './handles';
import { History } from './history';
import { dimensionLines, type DimensionLine } from './model/dimensions';
import { beams, bouncePaths, keepUnchanged, type Beam, type BouncePath } from './model/light-paths';
import { applyDiff, isEmptyDiff, type ModelDiff } from './model/diff';
import { documentFromModel, modelFromDocument, type Plan, type SetupDocument } from './model/document';
import type { GearSnapshot } from '$lib/scene/document';
import { boundsContain, boundsOfElements, elementBounds, expandBounds, hitTest, type Bounds } from './model/geometry';
import { emptySetupScene, modelFromScene } from './model/layout';
import { excludedElements, toExposureScene } from './model/scene';
import type { AmbientSettings, CameraSettings, EditorElement, ElementKind, Modifier } from './model/schema';
import { elementsInOrder, subjectOf, type EditorModel, type Vec2 } from './model/types';
import { HandTool } from './tools/hand-tool';
import { PinchGesture } from './tools/pinch';
import { PlaceTool } from './tools/place-tool';
import { SelectTool } from './tools/select-tool';
import { shortcutFor, type ShortcutAction } from './tools/shortcuts';
import type { SnapLine } from './tools/snap';
import type { Tool } from './tools/tool';
import type { PlanKeyInput, PlanPointer, PlanPointerInput, PlanWheelInput, ToolHost, ToolId } from './tools/types';
import { DEFAULT_VIEWPORT, fitBounds, panBy, screenToPlan, zoomAt, ZOOM_STEP, type Viewport } from './viewport';
import { readLengthM, UnitParseError } from '$lib/light/number-text';

/** What the editor reads of a setup document (`src/lib/scene`): the scene, and whatever else it has. */
export interface DocumentIn {
	scene: ExposureScene;
	plan?: Plan | Record<string, unknown>;
	notes?: string;
	gear?: readonly GearSnapshot[];
}

export interface EditorOptions {
	/** The setup document to edit (a plan of `{}` is laid out from the scene); none: an empty setup. */
	document?: DocumentIn;
	unitSystem?: UnitSystem;
	/** Session state to start from (e.g. kept by the page across a reload). */
	viewport?: Viewport;
}

export type LengthParse = { ok: true; valueM: number } | { ok: false; message: string };

const NUDGE_LARGE = 10;
const ROTATE_STEP_DEG = 15;

export class Editor implements ToolHost {
	// ----- the document -----
	#model = $state.raw<EditorModel>(modelFromScene(emptySetupScene()).model);
	#history = new History();
	#historyVersion = $state(0);
	#savedSignature = $state('');
	#loadNotes = $state.raw<string[]>([]);
	/** The document's notes and gear copies: the page edits notes, the server fills gear; both go back as given. */
	#notes = '';
	#gear: readonly GearSnapshot[] = [];

	// ----- session state (never saved) -----
	#selectedIds = $state.raw<readonly string[]>([]);
	#viewport = $state.raw<Viewport>(DEFAULT_VIEWPORT);
	#stageSize = $state.raw<{ widthPx: number; heightPx: number } | null>(null);
	#toolId = $state<ToolId>('select');
	#toolStateId = $state('idle');
	#placeKind = $state<ElementKind | null>(null);
	#snapLines = $state.raw<readonly SnapLine[]>([]);
	#marquee = $state.raw<Bounds | null>(null);
	#spaceHeld = $state(false);
	#hoverId = $state<string | null>(null);
	#hoverHandle = $state(false);
	#lastError = $state.raw<CommandError | null>(null);
	#fitPending = true;
	unitSystem = $state<UnitSystem>('metric');
	falloffVisible = $state(false);
	snapToGrid = $state(true);
	snapToElements = $state(true);
	/**
	 * Where a what-if trial would put a light (session state, never in the model or a save): the plan
	 * draws it as a dashed mark on its overlay, which exports and prints leave out.
	 */
	trialPosition = $state<{ id: string; xM: number; yM: number } | null>(null);
	/** The studio's gear-shelf modifiers, offered beside the presets (the page loads them). */
	shelfModifiers = $state<readonly Modifier[]>([]);

	// ----- input plumbing -----
	readonly #tools: Record<ToolId, Tool>;
	#pointers = new Map<number, Vec2>();
	#primaryPointer: number | null = null;
	#pinch: PinchGesture | null = null;
	#destroyed = false;
	readonly #falloffService = new FalloffService();
	#stopEffects: (() => void) | null = null;

	constructor(options: EditorOptions = {}) {
		this.#tools = { select: new SelectTool(this), hand: new HandTool(this), place: new PlaceTool(this) };
		if (options.unitSystem) this.unitSystem = options.unitSystem;
		if (options.document) this.loadDocument(options.document);
		else this.#savedSignature = this.#signature(this.#model);
		if (options.viewport) {
			this.#viewport = options.viewport;
			this.#fitPending = false;
		}
		if (this.#falloffService.usesWorker) {
			this.#stopEffects = $effect.root(() => {
				$effect(() => {
					if (this.falloffVisible) this.#falloffService.request(this.scene, this.planBounds);
					else this.#falloffService.clear();
				});
			});
		}
	}

	// ===== reading =====

	get model(): EditorModel {
		return this.#model;
	}
	/** The exposure scene of the plan: the body for `POST /api/v1/exposure`. */
	readonly scene = $derived(toExposureScene(this.#model));
	/** Elements the scene leaves out (a card with no light to bounce), with the reason. */
	readonly excluded = $derived(excludedElements(this.#model));
	/** Elements in drawing order. */
	readonly elements = $derived(elementsInOrder(this.#model));
	readonly subject = $derived(subjectOf(this.#model));
	get selectedIds(): readonly string[] {
		return this.#selectedIds;
	}
	readonly selectedElements = $derived(this.#selectedIds.map((id) => this.#model.elements[id]).filter((e): e is EditorElement => !!e));
	get viewport(): Viewport {
		return this.#viewport;
	}
	get stageSize() {
		return this.#stageSize;
	}
	get toolId(): ToolId {
		return this.#toolId;
	}
	/** The active tool's state (`idle`, `dragging`, `rotating`, ...). */
	get toolState(): string {
		return this.#toolStateId;
	}
	get placeKind(): ElementKind | null {
		return this.#placeKind;
	}
	get spaceHeld(): boolean {
		return this.#spaceHeld;
	}
	get snapLines(): readonly SnapLine[] {
		return this.#snapLines;
	}
	get marquee(): Bounds | null {
		return this.#marquee;
	}
	get hoverId(): string | null {
		return this.#hoverId;
	}
	/** The last refused command (named field and message), cleared by the next change. */
	get lastError(): CommandError | null {
		return this.#lastError;
	}
	/** What loading the document could not use (shown once, e.g. as a notice). */
	get loadNotes(): readonly string[] {
		return this.#loadNotes;
	}

	readonly gridSteps = $derived(gridSteps(this.unitSystem, this.#viewport.zoom));
	get gridStepM(): number {
		return this.gridSteps.minorM;
	}
	readonly scaleBar = $derived(scaleBar(this.unitSystem, this.#viewport.zoom));
	/** Grid lines in view (plan metres), for the stage. */
	readonly gridLines = $derived.by(() => {
		const size = this.#stageSize ?? { widthPx: 800, heightPx: 600 };
		return gridLines(this.#viewport, size.widthPx, size.heightPx, this.gridSteps);
	});
	// What the stage draws for every element is worked out here; an entry that has not changed keeps
	// its object, so the stage leaves its drawing alone while something else is dragged.
	#dimensionCache = new Map<string, DimensionLine>();
	#beamCache = new Map<string, Beam>();
	#bounceCache = new Map<string, BouncePath>();
	/** Dimension lines from each light and card to the subject, with true 3-D distances. */
	readonly dimensions = $derived.by(() => {
		const { list, byId } = keepUnchanged(this.#dimensionCache, dimensionLines(this.#model, this.unitSystem));
		this.#dimensionCache = byId;
		return list;
	});
	/** Each light's beam (angle, reach, kelvin). */
	readonly beams = $derived.by(() => {
		const { list, byId } = keepUnchanged(this.#beamCache, beams(this.#model));
		this.#beamCache = byId;
		return list;
	});
	/** Each card's path from its light to the subject. */
	readonly bouncePaths = $derived.by(() => {
		const { list, byId } = keepUnchanged(this.#bounceCache, bouncePaths(this.#model));
		this.#bounceCache = byId;
		return list;
	});
	/** The plan's extent with a margin: where the falloff map is computed. */
	readonly planBounds = $derived.by(() => {
		const b = boundsOfElements(Object.values(this.#model.elements)) ?? { minX: -0.2, minY: -0.2, maxX: 0.2, maxY: 0.2 };
		const margin = Math.max(0.1, 0.25 * Math.max(b.maxX - b.minX, b.maxY - b.minY));
		return expandBounds(b, margin);
	});
	readonly #falloffHere = $derived<FalloffGrid | null>(
		this.falloffVisible && !this.#falloffService.usesWorker ? falloffGrid(this.scene, this.planBounds) : null
	);
	/**
	 * The falloff map (stops relative to the subject), while it is switched on. In a browser it is
	 * computed in a worker and may lag a dragged light by one map; elsewhere it is computed on read.
	 */
	get falloff(): FalloffGrid | null {
		return this.#falloffService.usesWorker ? this.#falloffService.grid : this.#falloffHere;
	}

	readonly canUndo = $derived.by(() => (this.#historyVersion, this.#history.canUndo));
	readonly canRedo = $derived.by(() => (this.#historyVersion, this.#history.canRedo));
	/** Changed since loaded or last `markSaved()` (undoing back to it counts as unchanged). */
	readonly dirty = $derived(this.#signature(this.#model) !== this.#savedSignature);

	readonly cursor = $derived.by(() => {
		const s = this.#toolStateId;
		if (s === 'panning' || s === 'dragging') return 'grabbing';
		if (s === 'rotating') return 'crosshair';
		if (this.#toolId === 'hand' || this.#spaceHeld) return 'grab';
		if (this.#toolId === 'place') return 'copy';
		if (this.#hoverHandle) return 'crosshair';
		if (this.#hoverId) return this.#model.elements[this.#hoverId]?.locked ? 'pointer' : 'move';
		return 'default';
	});

	// ===== the document =====

	loadDocument(doc: DocumentIn) {
		this.#cancelGesture();
		const { model, notes } = modelFromDocument(doc);
		this.#notes = doc.notes ?? '';
		this.#gear = doc.gear ?? [];
		this.#model = model;
		this.#loadNotes = notes;
		this.#history.clear();
		this.#historyVersion++;
		this.#selectedIds = [];
		this.#savedSignature = this.#signature(model);
		this.#fitPending = true;
		if (this.#stageSize) this.zoomToFit();
	}

	/** The document to save: `{ schemaVersion, scene, plan, notes, gear }` (notes: the loaded ones unless given). */
	toDocument(notes = this.#notes): SetupDocument {
		return documentFromModel(this.#model, notes, this.#gear);
	}

	/** After a successful save: the current state is the saved one. */
	markSaved() {
		this.#savedSignature = this.#signature(this.#model);
	}

	#signature(model: EditorModel): string {
		const doc = documentFromModel(model);
		return JSON.stringify([doc.scene, doc.plan]);
	}

	// ===== commands and history =====

	#apply(diff: ModelDiff) {
		this.#model = applyDiff(this.#model, diff);
		const removed = this.#selectedIds.filter((id) => !(id in this.#model.elements));
		if (removed.length) this.#selectedIds = this.#selectedIds.filter((id) => id in this.#model.elements);
	}

	/** Runs a command as an undo step of its own. A refusal is kept in `lastError` and changes nothing. */
	execute(command: Command): CommandResult {
		if (this.#tools[this.#toolId].state.busy) this.#cancelGesture();
		return this.#run(command, true);
	}

	/** Runs a command inside the step in progress (tools, during a gesture). */
	applyInGesture(command: Command): CommandResult {
		return this.#run(command, false);
	}

	#run(command: Command, ownStep: boolean): CommandResult {
		const result = command(this.#model);
		if (!result.ok) {
			this.#lastError = result.error;
			return result;
		}
		this.#lastError = null;
		if (isEmptyDiff(result.diff)) return result;
		if (ownStep) this.#history.mark();
		this.#history.record(result.diff);
		this.#apply(result.diff);
		this.#historyVersion++;
		return result;
	}

	mark(): string {
		return this.#history.mark();
	}

	bailToMark(markId: string) {
		const diff = this.#history.bailToMark(markId);
		if (diff) this.#apply(diff);
		this.#historyVersion++;
	}

	undo() {
		this.#cancelGesture();
		const diff = this.#history.undo();
		if (diff) this.#apply(diff);
		this.#historyVersion++;
	}

	redo() {
		this.#cancelGesture();
		const diff = this.#history.redo();
		if (diff) this.#apply(diff);
		this.#historyVersion++;
	}

	/** Number of undo steps (one per gesture or discrete change). */
	get undoSteps(): number {
		void this.#historyVersion;
		return this.#history.undoSteps;
	}

	// ----- the usual commands, on the selection or by id -----

	/** Adds an element (at the view's centre, or beside the subject for lights and cards) and selects it. */
	addElement(kind: ElementKind, at?: { xM: number; yM: number; heightM?: number }): string | null {
		const place = at ?? this.#defaultPlace(kind);
		const result = this.execute(commands.addElement(kind, place));
		if (!result.ok) return null;
		this.select(result.createdIds);
		return result.createdIds[0];
	}

	#defaultPlace(kind: ElementKind): { xM: number; yM: number } {
		const subject = this.subject;
		if (subject && kind !== 'subject') {
			// Around the subject, each new one a little further round, so they do not stack.
			const count = Object.keys(this.#model.elements).length;
			const angle = (-135 + 50 * count) * (Math.PI / 180);
			const r = kind === 'background' ? 0 : kind === 'camera' ? 0.3 : 0.25;
			const step = this.gridStepM;
			const round = (v: number) => Math.round(v / step) * step;
			return { xM: round(subject.xM + r * Math.cos(angle)), yM: round(subject.yM + r * Math.sin(angle)) };
		}
		const size = this.#stageSize ?? { widthPx: 800, heightPx: 600 };
		const [xM, yM] = screenToPlan(this.#viewport, [size.widthPx / 2, size.heightPx / 2]);
		return { xM, yM };
	}

	deleteSelected() {
		return this.execute(commands.removeElements(this.#selectedIds));
	}
	/** Deletes elements by id (the element list); locked ones and the subject stay. */
	deleteElements(ids: readonly string[]) {
		return this.execute(commands.removeElements(ids));
	}
	duplicateSelected() {
		const step = this.gridStepM;
		const offset = Math.max(0.02, Math.ceil(0.03 / step) * step);
		const result = this.execute(commands.duplicateElements(this.#selectedIds, [offset, offset]));
		if (result.ok) this.select(result.createdIds);
		return result;
	}
	setLockedSelected(locked: boolean) {
		return this.execute(commands.setLocked(this.#selectedIds, locked));
	}
	toggleLockSelected() {
		const anyUnlocked = this.selectedElements.some((e) => !e.locked);
		return this.setLockedSelected(anyUnlocked);
	}
	aimSelectedAtSubject() {
		return this.execute(commands.aimAtSubject(this.#selectedIds));
	}
	rotateSelectedBy(deltaDeg: number) {
		return this.execute(commands.rotateElementsBy(this.#selectedIds, deltaDeg));
	}
	/** Moves the selection; a held key's repeats join the first press's undo step. */
	nudgeSelected(dxM: number, dyM: number, repeat = false) {
		const command = commands.moveElementsBy(this.#selectedIds, dxM, dyM);
		return repeat && this.#history.canUndo ? this.applyInGesture(command) : this.execute(command);
	}
	/** Moves one element to typed plan coordinates (the element list). */
	moveElementTo(id: string, xM: number, yM: number) {
		return this.execute(commands.moveElementsTo({ [id]: { xM, yM } }));
	}
	setProperties(id: string, patch: Readonly<Record<string, unknown>>) {
		return this.execute(commands.setElementProperties(id, patch));
	}
	setCameraSettings(patch: Partial<CameraSettings>) {
		return this.execute(commands.setCameraSettings(patch));
	}
	setAmbient(ambient: AmbientSettings | null) {
		return this.execute(commands.setAmbient(ambient));
	}
	bringSelectedToFront() {
		return this.execute(commands.bringToFront(this.#selectedIds));
	}
	sendSelectedToBack() {
		return this.execute(commands.sendToBack(this.#selectedIds));
	}

	// ===== selection =====

	select(ids: readonly string[]) {
		const valid = ids.filter((id, i) => id in this.#model.elements && ids.indexOf(id) === i);
		const same = valid.length === this.#selectedIds.length && valid.every((id, i) => id === this.#selectedIds[i]);
		if (!same) this.#selectedIds = valid;
	}
	toggleSelected(id: string) {
		this.select(this.#selectedIds.includes(id) ? this.#selectedIds.filter((s) => s !== id) : [...this.#selectedIds, id]);
	}
	selectAll() {
		this.select(this.elements.map((e) => e.id));
	}
	clearSelection() {
		this.select([]);
	}
	/** Keyboard: the next (or previous) element in drawing order. */
	selectNext(backwards = false) {
		const order = this.elements.map((e) => e.id);
		if (!order.length) return;
		const current = this.#selectedIds.at(-1);
		const at = current ? order.indexOf(current) : -1;
		const next = at < 0 ? (backwards ? order.length - 1 : 0) : (at + (backwards ? -1 : 1) + order.length) % order.length;
		this.select([order[next]]);
	}

	// ===== ToolHost =====

	elementAt(planM: Vec2): EditorElement | null {
		return hitTest(this.#model, planM, HIT_MARGIN_PX / this.#viewport.zoom);
	}
	onRotationHandle(planM: Vec2): boolean {
		if (this.#selectedIds.length !== 1) return false;
		const el = this.#model.elements[this.#selectedIds[0]];
		if (!el || el.locked) return false;
		const h = rotationHandlePosition(el, this.#viewport.zoom);
		return Math.hypot(planM[0] - h[0], planM[1] - h[1]) <= ROTATION_HANDLE_HIT_PX / this.#viewport.zoom;
	}
	elementsInside(bounds: Bounds): EditorElement[] {
		return this.elements.filter((el) => boundsContain(bounds, elementBounds(el)));
	}
	setSnapLines(lines: readonly SnapLine[]) {
		// The same guides again are left alone (no redraw).
		if (lines.length === this.#snapLines.length && JSON.stringify(lines) === JSON.stringify(this.#snapLines)) return;
		this.#snapLines = lines;
	}
	setMarquee(bounds: Bounds | null) {
		this.#marquee = bounds;
	}
	setTool(id: ToolId) {
		if (id === this.#toolId) return;
		this.#tools[this.#toolId].exit();
		this.#toolId = id;
		if (id !== 'place') this.#placeKind = null;
		this.#syncToolState();
	}
	/** Arms the place tool: the next press on the plan puts a new element there. */
	startPlacing(kind: ElementKind) {
		this.setTool('place');
		this.#placeKind = kind;
	}

	// ===== view =====

	setStageSize(widthPx: number, heightPx: number) {
		if (!(widthPx > 0 && heightPx > 0)) return;
		const old = this.#stageSize;
		if (old && old.widthPx === widthPx && old.heightPx === heightPx) return;
		this.#stageSize = { widthPx, heightPx };
		if (this.#fitPending) this.zoomToFit();
		else if (old) this.#viewport = panBy(this.#viewport, (widthPx - old.widthPx) / 2, (heightPx - old.heightPx) / 2);
	}
	setViewport(viewport: Viewport) {
		this.#viewport = viewport;
		this.#fitPending = false;
	}
	panBy(dxPx: number, dyPx: number) {
		this.#viewport = panBy(this.#viewport, dxPx, dyPx);
		this.#fitPending = false;
	}
	zoomBy(factor: number, aroundScreen?: Vec2) {
		const size = this.#stageSize ?? { widthPx: 800, heightPx: 600 };
		this.#viewport = zoomAt(this.#viewport, aroundScreen ?? [size.widthPx / 2, size.heightPx / 2], factor);
		this.#fitPending = false;
	}
	zoomIn() {
		this.zoomBy(ZOOM_STEP);
	}
	zoomOut() {
		this.zoomBy(1 / ZOOM_STEP);
	}
	/** The plan's own frame of the table (the document's `plan.viewport`), if it has one. */
	get planFrame(): Bounds | null {
		const v = this.#model.kept.rest.viewport as { center?: [number, number]; widthM?: number; depthM?: number } | undefined;
		if (!v?.center || !v.widthM || !v.depthM) return null;
		return { minX: v.center[0] - v.widthM / 2, maxX: v.center[0] + v.widthM / 2, minY: v.center[1] - v.depthM / 2, maxY: v.center[1] + v.depthM / 2 };
	}

	/** Shows the whole plan: its elements, and the document's frame of the table when it has one. */
	zoomToFit() {
		const size = this.#stageSize;
		if (!size) return;
		const content = boundsOfElements(Object.values(this.#model.elements).filter((e) => e.kind !== 'background')) ?? boundsOfElements(this.elements);
		const frame = this.planFrame;
		const b =
			content && frame
				? { minX: Math.min(content.minX, frame.minX), minY: Math.min(content.minY, frame.minY), maxX: Math.max(content.maxX, frame.maxX), maxY: Math.max(content.maxY, frame.maxY) }
				: (content ?? frame);
		if (!b) return;
		this.#viewport = fitBounds(expandBounds(b, 0.03), size.widthPx, size.heightPx);
		this.#fitPending = false;
	}
	screenToPlan(screen: Vec2): Vec2 {
		return screenToPlan(this.#viewport, screen);
	}

	// ===== units =====

	formatLength(m: number): string {
		return formatDistance(m, this.unitSystem);
	}
	/**
	 * A typed length (`30 cm`, `1 ft + 2 in`, `12`): a bare number is cm in metric, inches in imperial.
	 * The unit parser (mathjs) is loaded only for text that is not a plain number.
	 */
	async parseLength(text: string): Promise<LengthParse> {
		try {
			return { ok: true, valueM: await readLengthM(text, this.unitSystem === 'imperial' ? 'in' : 'cm') };
		} catch (e) {
			if (e instanceof UnitParseError) return { ok: false, message: e.message };
			throw e;
		}
	}

	// ===== input =====

	#pointer(input: PlanPointerInput): PlanPointer {
		const screen: Vec2 = [input.screenX, input.screenY];
		return {
			screen,
			planM: screenToPlan(this.#viewport, screen),
			pointerId: input.pointerId ?? 1,
			pointerType: input.pointerType ?? 'mouse',
			button: input.button ?? 0,
			shiftKey: input.shiftKey ?? false,
			altKey: input.altKey ?? false,
			ctrlKey: input.ctrlKey ?? false,
			metaKey: input.metaKey ?? false
		};
	}

	#syncToolState() {
		this.#toolStateId = this.#tools[this.#toolId].stateId;
	}

	get #tool(): Tool {
		return this.#tools[this.#toolId];
	}

	pointerDown(input: PlanPointerInput) {
		if (this.#destroyed) return;
		const e = this.#pointer(input);
		this.#pointers.set(e.pointerId, e.screen);
		if (this.#pointers.size === 2) {
			// A second finger: whatever the first one began is undone, and the two pinch the view.
			this.#tool.cancel();
			this.#syncToolState();
			const [a, b] = [...this.#pointers.values()];
			this.#pinch = new PinchGesture(this.#viewport, a, b);
			this.#primaryPointer = null;
			return;
		}
		if (this.#pointers.size > 2 || this.#pinch) return;
		this.#primaryPointer = e.pointerId;
		this.#tool.pointerDown(e);
		this.#syncToolState();
	}

	pointerMove(input: PlanPointerInput) {
		if (this.#destroyed) return;
		const e = this.#pointer(input);
		if (this.#pointers.has(e.pointerId)) this.#pointers.set(e.pointerId, e.screen);
		if (this.#pinch) {
			if (this.#pointers.size >= 2) {
				const [a, b] = [...this.#pointers.values()];
				this.#viewport = this.#pinch.viewportFor(a, b);
				this.#fitPending = false;
			}
			return;
		}
		if (this.#primaryPointer !== null && e.pointerId !== this.#primaryPointer) return;
		if (this.#primaryPointer === null && this.#pointers.size) return;
		if (this.#toolStateId === 'idle') {
			const hit = this.elementAt(e.planM);
			this.#hoverId = hit?.id ?? null;
			this.#hoverHandle = this.onRotationHandle(e.planM);
		}
		this.#tool.pointerMove(e);
		this.#syncToolState();
	}

	pointerUp(input: PlanPointerInput) {
		if (this.#destroyed) return;
		const e = this.#pointer(input);
		this.#pointers.delete(e.pointerId);
		if (this.#pinch) {
			if (this.#pointers.size < 2) this.#pinch = null;
			return;
		}
		if (e.pointerId !== this.#primaryPointer) return;
		this.#primaryPointer = null;
		this.#tool.pointerUp(e);
		this.#syncToolState();
	}

	/** The browser took the pointer away (a system gesture, the window lost focus): undo the gesture. */
	pointerCancel(input: PlanPointerInput) {
		this.#pointers.delete(input.pointerId ?? 1);
		if (this.#pinch && this.#pointers.size < 2) this.#pinch = null;
		this.#primaryPointer = null;
		this.#cancelGesture();
	}

	pointerLeave() {
		this.#hoverId = null;
		this.#hoverHandle = false;
	}

	wheel(input: PlanWheelInput) {
		if (this.#destroyed) return;
		const unit = input.deltaMode === 1 ? 16 : input.deltaMode === 2 ? (this.#stageSize?.heightPx ?? 600) : 1;
		const dx = (input.deltaX ?? 0) * unit;
		const dy = input.deltaY * unit;
		if (input.shiftKey && !input.ctrlKey && !input.metaKey) {
			// Shift + wheel pans; a wheel that scrolls sideways already sends deltaX.
			this.panBy(-(dx || dy), 0);
			return;
		}
		// A pinch on a touchpad arrives as a wheel with Ctrl and small deltas: zoom faster per pixel.
		const factor = 2 ** (-dy / (input.ctrlKey ? 100 : 500));
		this.zoomBy(factor, [input.screenX, input.screenY]);
	}

	/** A key pressed with the plan focused. Returns true when it was used (the caller prevents the default). */
	keyDown(input: PlanKeyInput): boolean {
		if (this.#destroyed) return false;
		if (input.key === ' ') {
			this.#spaceHeld = true;
			return true;
		}
		if (this.#tool.keyDown(input)) {
			this.#syncToolState();
			return true;
		}
		const shortcut = shortcutFor(input);
		if (!shortcut) return false;
		if (shortcut.action === 'clear-selection') {
			if (this.#tool.state.busy) {
				this.#cancelGesture();
				return true;
			}
			if (this.#toolId !== 'select') {
				this.setTool('select');
				return true;
			}
			if (!this.#selectedIds.length) return false;
			this.clearSelection();
			return true;
		}
		if (this.#tool.state.busy) return true;
		this.#runShortcut(shortcut.action, input);
		return true;
	}

	keyUp(input: PlanKeyInput) {
		if (input.key === ' ') this.#spaceHeld = false;
	}

	#runShortcut(action: ShortcutAction, e: PlanKeyInput) {
		const step = this.gridStepM * (e.shiftKey ? NUDGE_LARGE : 1);
		const nudge = (dx: number, dy: number) => {
			if (this.#selectedIds.length) this.nudgeSelected(dx * step, dy * step, e.repeat);
			else this.panBy(-dx * 40, -dy * 40);
		};
		switch (action) {
			case 'undo': return this.undo();
			case 'redo': return this.redo();
			case 'delete': return void this.deleteSelected();
			case 'duplicate': return void this.duplicateSelected();
			case 'select-all': return this.selectAll();
			case 'select-next': return this.selectNext(false);
			case 'select-previous': return this.selectNext(true);
			case 'clear-selection': return this.clearSelection();
			case 'nudge-left': return void nudge(-1, 0);
			case 'nudge-right': return void nudge(1, 0);
			case 'nudge-up': return void nudge(0, -1);
			case 'nudge-down': return void nudge(0, 1);
			case 'rotate-clockwise': return void this.rotateSelectedBy(ROTATE_STEP_DEG);
			case 'rotate-anticlockwise': return void this.rotateSelectedBy(-ROTATE_STEP_DEG);
			case 'aim-at-subject': return void this.aimSelectedAtSubject();
			case 'toggle-lock': return void this.toggleLockSelected();
			case 'bring-to-front': return void this.bringSelectedToFront();
			case 'send-to-back': return void this.sendSelectedToBack();
			case 'zoom-in': return this.zoomIn();
			case 'zoom-out': return this.zoomOut();
			case 'zoom-to-fit': return this.zoomToFit();
			case 'select-tool': return this.setTool('select');
			case 'hand-tool': return this.setTool('hand');
			case 'toggle-falloff': this.falloffVisible = !this.falloffVisible; return;
			case 'toggle-grid-snap': this.snapToGrid = !this.snapToGrid; return;
		}
	}

	#cancelGesture() {
		const tool = this.#tools[this.#toolId];
		if (tool.state.busy || tool.stateId !== 'idle') tool.cancel();
		this.#syncToolState();
	}

	/** Ends every gesture and stops taking input. */
	destroy() {
		this.#stopEffects?.();
		this.#stopEffects = null;
		this.#falloffService.destroy();
		this.#cancelGesture();
		this.#pointers.clear();
		this.#pinch = null;
		this.#destroyed = true;
	}
}
