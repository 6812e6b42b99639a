/** What tools receive and what they may ask of the editor. Plain data: tests build them by hand. */
import type { Command, CommandResult } from '../commands';
import type { Bounds } from '../model/geometry';
import type { EditorElement, ElementKind } from '../model/schema';
import type { EditorModel, Vec2 } from '../model/types';
import type { Viewport } from '../viewport';
import type { SnapLine } from './snap';

export interface Modifiers {
	shiftKey: boolean;
	altKey: boolean;
	ctrlKey: boolean;
	metaKey: boolean;
}

/** A pointer event as the stage forwards it: screen pixels relative to the stage's top-left corner. */
export interface PlanPointerInput extends Partial<Modifiers> {
	screenX: number;
	screenY: number;
	pointerId?: number;
	pointerType?: 'mouse' | 'pen' | 'touch';
	/** 0 main, 1 middle, 2 secondary (DOM numbering). */
	button?: number;
}

/** The same with the plan point filled in by the editor. */
export interface PlanPointer extends Modifiers {
	screen: Vec2;
	planM: Vec2;
	pointerId: number;
	pointerType: 'mouse' | 'pen' | 'touch';
	button: number;
}

export interface PlanKeyInput extends Partial<Modifiers> {
	key: string;
	repeat?: boolean;
}

export interface PlanWheelInput extends Partial<Modifiers> {
	screenX: number;
	screenY: number;
	deltaX?: number;
	deltaY: number;
	/** 0 pixels, 1 lines, 2 pages (DOM numbering). */
	deltaMode?: number;
}

export type ToolId = 'select' | 'hand' | 'place';

export interface ToolHost {
	readonly model: EditorModel;
	readonly selectedIds: readonly string[];
	readonly viewport: Viewport;
	readonly spaceHeld: boolean;
	/** Minor grid step (the snapping step), metres. */
	readonly gridStepM: number;
	readonly snapToGrid: boolean;
	readonly snapToElements: boolean;
	readonly placeKind: ElementKind | null;
	select(ids: readonly string[]): void;
	/** The element under a plan point (with a margin of a few screen pixels). */
	elementAt(planM: Vec2): EditorElement | null;
	/** Is the point on the rotation handle of the (single) selected element? */
	onRotationHandle(planM: Vec2): boolean;
	elementsInside(bounds: Bounds): EditorElement[];
	/** Begins an undo step (a gesture); returns the mark to bail to. */
	mark(): string;
	/** Applies a command inside the step in progress. */
	applyInGesture(command: Command): CommandResult;
	/** Undoes everything since the mark and forgets it. */
	bailToMark(markId: string): void;
	/** A discrete change: a step of its own. */
	execute(command: Command): CommandResult;
	panBy(dxPx: number, dyPx: number): void;
	setSnapLines(lines: readonly SnapLine[]): void;
	setMarquee(bounds: Bounds | null): void;
	setTool(id: ToolId): void;
}
