/**
 * The plan editor's client state: the model (the setup's scene and plan), its undo history and the
 * commands that change it, the selection and the active tool. Every change to the model goes through a
 * command. The rest is in its own file and reached through the same public API: the view
 * (`view.svelte.ts`), pointer and pinch routing (`pointer-input.svelte.ts`), keys
 * (`keyboard.ts`) and what the stage draws besides the elements (`drawing.svelte.ts`). One instance
 * per editor page, handed down with `setEditorContext`; call `destroy()` when the page goes.
 */
import { formatDistance, type UnitSystem } from '$lib/light/format';
import type { GearSnapshot } from '$lib/scene/document';
import { ActiveTool } from './active-tool.svelte';
import * as commands from './commands';
import type { Command, CommandError, CommandResult } from './commands';
import { PlanDrawing } from './drawing.svelte';
import { HIT_MARGIN_PX, onRotationHandleOf } from './handles';
import { History } from './history';
import { keyDown } from './keyboard';
import { liveExposure } from './live-exposure';
import { applyDiff, isEmptyDiff, type ModelDiff } from './model/diff';
import type { OpenedDocument, SetupDocument } from './model/document';
import { documentFromModel } from './model/to-document';
import { boundsContain, elementBounds, hitTest, type Bounds } from './model/geometry';
import { emptySetupScene, modelFromScene, placeForNew } from './model/layout';
import { excludedElements, toExposureScene } from './model/scene';
import type { EditorElement, ElementKind, Modifier } from './model/schema';
import type { ShelfGearLists } from './model/shelf';
import { elementsInOrder, nextInOrder, subjectOf, type EditorModel, type Vec2 } from './model/types';
import { PointerInput } from './pointer-input.svelte';
import type { SnapLine } from './tools/snap';
import type { PlanKeyInput, PlanPointerInput, PlanWheelInput, ToolHost, ToolId } from './tools/types';
import { EditorView, fitTarget, planFrame } from './view.svelte';
import { visibleBounds, type Viewport } from './viewport';
import { readLengthM, UnitParseError } from '$lib/light/number-text';

export interface EditorOptions {
	/**
	 * The setup document to edit, read into the model (`openDocument` in model/document.ts; a plan of
	 * `{}` is laid out from the scene); none: an empty setup. The reading is the caller's, so the setup
	 * page can start from the model its server read and the editor itself needs no schema.
	 */
	document?: OpenedDocument;
	unitSystem?: UnitSystem;
	/** Session state to start from (e.g. kept by the page across a reload). */
	viewport?: Viewport;
}

export type LengthParse = { ok: true; valueM: number } | { ok: false; message: string };

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
	#snapLines = $state.raw<readonly SnapLine[]>([]);
	#marquee = $state.raw<Bounds | null>(null);
	#lastError = $state.raw<CommandError | null>(null);
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
	/** The studio's gear-shelf flashes, camera bodies and lenses, offered in the inspector (the page loads them). */
	shelfGear = $state.raw<ShelfGearLists>({ flashes: [], cameras: [], lenses: [] });

	// ----- the parts in their own files -----
	readonly #tool = new ActiveTool(this);
	readonly #view: EditorView;
	readonly #input: PointerInput;
	readonly #drawing: PlanDrawing;
	#destroyed = false;

	constructor(options: EditorOptions = {}) {
		if (options.unitSystem) this.unitSystem = options.unitSystem;
		this.#view = new EditorView({ unitSystem: () => this.unitSystem, fitTarget: () => fitTarget(this.#model) });
		this.#drawing = new PlanDrawing({
			model: () => this.#model,
			scene: () => this.scene,
			unitSystem: () => this.unitSystem,
			falloffVisible: () => this.falloffVisible,
			visibleBounds: () => {
				const size = this.#view.stageSize;
				return size ? visibleBounds(this.#view.viewport, size.widthPx, size.heightPx) : null;
			}
		});
		this.#input = new PointerInput(this, this.#tool);
		if (options.document) this.loadDocument(options.document);
		else this.#savedSignature = this.#signature(this.#model);
		if (options.viewport) this.#view.setViewport(options.viewport);
	}

	// ===== reading =====

	get model(): EditorModel { return this.#model; }
	/** The exposure scene of the plan: the body for `POST /api/v1/exposure`. */
	readonly scene = $derived(toExposureScene(this.#model));
	/** The scene's exposure, computed here by the engine (or the field the checks refuse). */
	readonly exposure = $derived(liveExposure(this.scene));
	/** Elements the scene leaves out (a card with no light to bounce), with the reason. */
	readonly excluded = $derived(excludedElements(this.#model));
	/** Elements in drawing order. */
	readonly elements = $derived(elementsInOrder(this.#model));
	readonly subject = $derived(subjectOf(this.#model));
	get selectedIds(): readonly string[] { return this.#selectedIds; }
	readonly selectedElements = $derived(this.#selectedIds.map((id) => this.#model.elements[id]).filter((e): e is EditorElement => !!e));
	get toolId(): ToolId { return this.#tool.id; }
	/** The active tool's state (`idle`, `dragging`, `rotating`, ...). */
	get toolState(): string { return this.#tool.stateId; }
	get placeKind(): ElementKind | null { return this.#tool.placeKind; }
	get spaceHeld(): boolean { return this.#tool.spaceHeld; }
	get snapLines(): readonly SnapLine[] { return this.#snapLines; }
	get marquee(): Bounds | null { return this.#marquee; }
	get hoverId(): string | null { return this.#input.hoverId; }
	/** The last refused command (named field and message), cleared by the next change. */
	get lastError(): CommandError | null { return this.#lastError; }
	/** What loading the document could not use (shown once, e.g. as a notice). */
	get loadNotes(): readonly string[] { return this.#loadNotes; }

	/** Dimension lines from each light and card to the subject, with true 3-D distances. */
	get dimensions() { return this.#drawing.dimensions; }
	/** Each light's beam (angle, reach, kelvin). */
	get beams() { return this.#drawing.beams; }
	/** Each card's path from its light to the subject. */
	get bouncePaths() { return this.#drawing.bouncePaths; }
	/** The plan's extent with a margin: where the falloff map is computed. */
	get planBounds() { return this.#drawing.planBounds; }
	/** The falloff map while it is switched on (computed in a worker in a browser; may lag a drag by one map). */
	get falloff() { return this.#drawing.falloff; }

	readonly canUndo = $derived.by(() => (this.#historyVersion, this.#history.canUndo));
	readonly canRedo = $derived.by(() => (this.#historyVersion, this.#history.canRedo));
	/** Changed since loaded or last `markSaved()` (undoing back to it counts as unchanged). */
	readonly dirty = $derived(this.#signature(this.#model) !== this.#savedSignature);

	readonly cursor = $derived.by(() => {
		const hovered = this.#input.hoverId ? this.#model.elements[this.#input.hoverId] : undefined;
		return this.#tool.cursor(this.#input.hoverHandle ? 'handle' : hovered ? (hovered.locked ? 'locked' : 'element') : null);
	});

	// ===== the document =====

	loadDocument(doc: OpenedDocument) {
		this.#tool.cancelGesture();
		const { model, notes } = doc.read;
		this.#notes = doc.notes ?? '';
		this.#gear = doc.gear ?? [];
		this.#model = model;
		this.#loadNotes = notes;
		this.#history.clear();
		this.#historyVersion++;
		this.#selectedIds = [];
		this.#savedSignature = this.#signature(model);
		this.#view.refit();
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
		if (this.#tool.busy) this.#tool.cancelGesture();
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
		this.#travel(this.#history.bailToMark(markId));
	}
	undo() {
		this.#tool.cancelGesture();
		this.#travel(this.#history.undo());
	}
	redo() {
		this.#tool.cancelGesture();
		this.#travel(this.#history.redo());
	}
	/** Applies what the history hands back (nothing at either end). */
	#travel(diff: ModelDiff | null | undefined) {
		if (diff) this.#apply(diff);
		this.#historyVersion++;
	}

	/** Number of undo steps (one per gesture or discrete change). */
	get undoSteps(): number {
		void this.#historyVersion;
		return this.#history.undoSteps;
	}

	// ----- the usual commands, on the selection or by id -----
	// What a user types (properties, camera settings, the ambient) is set with `execute` and the checked
	// commands of commands-properties.ts, which the panels that type it bring with them.

	/** Adds an element (at the view's centre, or beside the subject for lights and cards) and selects it. */
	addElement(kind: ElementKind, at?: { xM: number; yM: number; heightM?: number }): string | null {
		const place = at ?? placeForNew(this.#model, kind, this.gridStepM, this.#view.centre);
		const result = this.execute(commands.addElement(kind, place));
		if (!result.ok) return null;
		this.select(result.createdIds);
		return result.createdIds[0];
	}

	deleteSelected() { return this.execute(commands.removeElements(this.#selectedIds)); }
	/** Deletes elements by id (the element list); locked ones and the subject stay. */
	deleteElements(ids: readonly string[]) { return this.execute(commands.removeElements(ids)); }
	duplicateSelected() {
		const step = this.gridStepM;
		const offset = Math.max(0.02, Math.ceil(0.03 / step) * step);
		const result = this.execute(commands.duplicateElements(this.#selectedIds, [offset, offset]));
		if (result.ok) this.select(result.createdIds);
		return result;
	}
	setLockedSelected(locked: boolean) { return this.execute(commands.setLocked(this.#selectedIds, locked)); }
	toggleLockSelected() {
		const anyUnlocked = this.selectedElements.some((e) => !e.locked);
		return this.setLockedSelected(anyUnlocked);
	}
	aimSelectedAtSubject() { return this.execute(commands.aimAtSubject(this.#selectedIds)); }
	rotateSelectedBy(deltaDeg: number) { return this.execute(commands.rotateElementsBy(this.#selectedIds, deltaDeg)); }
	/** Moves the selection; a held key's repeats join the first press's undo step. */
	nudgeSelected(dxM: number, dyM: number, repeat = false) {
		const command = commands.moveElementsBy(this.#selectedIds, dxM, dyM);
		return repeat && this.#history.canUndo ? this.applyInGesture(command) : this.execute(command);
	}
	/** Moves one element to typed plan coordinates (the element list). */
	moveElementTo(id: string, xM: number, yM: number) { return this.execute(commands.moveElementsTo({ [id]: { xM, yM } })); }
	bringSelectedToFront() { return this.execute(commands.bringToFront(this.#selectedIds)); }
	sendSelectedToBack() { return this.execute(commands.sendToBack(this.#selectedIds)); }

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
		const next = nextInOrder(this.elements.map((e) => e.id), this.#selectedIds.at(-1), backwards);
		if (next !== undefined) this.select([next]);
	}

	// ===== ToolHost =====

	elementAt(planM: Vec2): EditorElement | null {
		return hitTest(this.#model, planM, HIT_MARGIN_PX / this.viewport.zoom);
	}
	onRotationHandle(planM: Vec2): boolean {
		if (this.#selectedIds.length !== 1) return false;
		const el = this.#model.elements[this.#selectedIds[0]];
		return !!el && !el.locked && onRotationHandleOf(el, planM, this.viewport.zoom);
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
	setTool(id: ToolId) { this.#tool.set(id); }
	/** Arms the place tool: the next press on the plan puts a new element there. */
	startPlacing(kind: ElementKind) { this.#tool.startPlacing(kind); }

	// ===== view (view.svelte.ts) =====

	get viewport(): Viewport { return this.#view.viewport; }
	get stageSize() { return this.#view.stageSize; }
	get gridSteps() { return this.#view.gridSteps; }
	/** Minor grid step (the snapping step), metres. */
	get gridStepM(): number { return this.#view.gridSteps.minorM; }
	get scaleBar() { return this.#view.scaleBar; }
	/** Grid lines in view (plan metres), for the stage. */
	get gridLines() { return this.#view.gridLines; }
	setStageSize(widthPx: number, heightPx: number) { this.#view.setStageSize(widthPx, heightPx); }
	setViewport(viewport: Viewport) { this.#view.setViewport(viewport); }
	panBy(dxPx: number, dyPx: number) { this.#view.panBy(dxPx, dyPx); }
	zoomBy(factor: number, aroundScreen?: Vec2) { this.#view.zoomBy(factor, aroundScreen); }
	zoomIn() { this.#view.zoomIn(); }
	zoomOut() { this.#view.zoomOut(); }
	/** Shows the whole plan: its elements, and the document's frame of the table when it has one. */
	zoomToFit() { this.#view.zoomToFit(); }
	screenToPlan(screen: Vec2): Vec2 { return this.#view.screenToPlan(screen); }

	/** The plan's own frame of the table (the document's `plan.viewport`), if it has one. */
	get planFrame(): Bounds | null { return planFrame(this.#model); }

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

	// ===== input (pointer-input.svelte.ts, keyboard.ts) =====

	pointerDown(input: PlanPointerInput) { if (!this.#destroyed) this.#input.down(input); }
	pointerMove(input: PlanPointerInput) { if (!this.#destroyed) this.#input.move(input); }
	pointerUp(input: PlanPointerInput) { if (!this.#destroyed) this.#input.up(input); }
	/** The browser took the pointer away (a system gesture, the window lost focus): undo the gesture. */
	pointerCancel(input: PlanPointerInput) { this.#input.cancel(input); }
	pointerLeave() { this.#input.leave(); }
	wheel(input: PlanWheelInput) { if (!this.#destroyed) this.#input.wheel(input); }
	/** A key pressed with the plan focused. Returns true when it was used (the caller prevents the default). */
	keyDown(input: PlanKeyInput): boolean {
		return !this.#destroyed && keyDown(this, this.#tool, input);
	}
	keyUp(input: PlanKeyInput) {
		if (input.key === ' ') this.#tool.spaceHeld = false;
	}

	/** Ends every gesture and stops taking input. */
	destroy() {
		this.#drawing.destroy();
		this.#tool.cancelGesture();
		this.#input.clear();
		this.#destroyed = true;
	}
}
