import {
	PDFArray,
	PDFDict,
	PDFName,
	PDFRef,
	PDFStream,
	type PDFDocument,
	type PDFObject
} from 'pdf-lib';

// Content disarm for downloads: whatever the upload check let through, the copy a reader gets
// carries no action but in-document navigation, no scripts, no attached files and no XFA form.
// Run on a document pdf-lib loaded from qpdf's plain rewrite (./qpdf.ts, rewritePlain), so
// every object is really in view: pdf-lib alone can miss objects inside object streams.

/** Removed from every dictionary, wherever they stand. */
const ALWAYS_REMOVED = [
	'OpenAction', // the catalog's open action (a destination here is a convenience we give up)
	'AA', // additional actions: document, page, annotation and form-field events
	'JS',
	'JavaScript', // document-level scripts in the /Names dictionary
	'EmbeddedFiles', // attached files in the /Names dictionary
	'EF', // a file specification's embedded file streams
	'XFA', // an AcroForm's XML form (its scripts run in some readers)
	'NeedsRendering',
	'RichMediaContent'
].map((name) => PDFName.of(name));

/** Keys whose value may be an action: kept only when it is a /GoTo (then without /Next). */
const ACTION_KEYS = ['A', 'PA'].map((name) => PDFName.of(name));

/** Annotations dropped from every page: attachments and media that run their own content. */
const DROPPED_ANNOTATIONS = new Set([
	'FileAttachment',
	'RichMedia',
	'3D',
	'Screen',
	'Movie',
	'Sound'
]);

const S = PDFName.of('S');
const NEXT = PDFName.of('Next');
const GOTO = PDFName.of('GoTo');
const ANNOTS = PDFName.of('Annots');
const SUBTYPE = PDFName.of('Subtype');

function nameOf(object: PDFObject | undefined): string | undefined {
	return object instanceof PDFName ? object.decodeText() : undefined;
}

/**
 * Strips every action dictionary but in-document /GoTo, every script, attachment and XFA
 * form from `doc`, then deletes the objects nothing refers to any more (the detached actions
 * and files), so not even an unused copy stays in the file.
 */
export function disarmPdf(doc: PDFDocument): void {
	const { context } = doc;
	const lookup = (object: PDFObject | undefined) =>
		object instanceof PDFRef ? context.lookup(object) : object;

	const cleanDict = (dict: PDFDict): void => {
		for (const key of ALWAYS_REMOVED) dict.delete(key);
		for (const key of ACTION_KEYS) {
			// An action is a dictionary with /S; a structure element's /A (attributes) is not.
			const action = lookup(dict.get(key));
			if (!(action instanceof PDFDict) || action.get(S) === undefined) continue;
			if (action.get(S) === GOTO) {
				action.delete(NEXT);
			} else {
				dict.delete(key);
			}
		}
		const annots = lookup(dict.get(ANNOTS));
		if (annots instanceof PDFArray) {
			const kept = annots.asArray().filter((entry) => {
				const annot = lookup(entry);
				const subtype = annot instanceof PDFDict ? nameOf(annot.get(SUBTYPE)) : undefined;
				return subtype === undefined || !DROPPED_ANNOTATIONS.has(subtype);
			});
			dict.set(ANNOTS, context.obj(kept));
		}
	};

	const visit = (object: PDFObject | undefined, seen: Set<PDFObject>): void => {
		if (object === undefined || seen.has(object)) return;
		seen.add(object);
		if (object instanceof PDFStream) {
			visit(object.dict, seen);
		} else if (object instanceof PDFDict) {
			cleanDict(object);
			for (const [, value] of object.entries()) visit(value, seen);
		} else if (object instanceof PDFArray) {
			for (const item of object.asArray()) visit(item, seen);
		}
	};
	const seen = new Set<PDFObject>();
	for (const [, object] of context.enumerateIndirectObjects()) visit(object, seen);

	// Keep only what the trailer still reaches (iteratively: outlines chain thousands deep).
	const reachable = new Set<string>();
	const pending: Array<PDFObject | undefined> = [
		context.trailerInfo.Root,
		context.trailerInfo.Info
	];
	while (pending.length > 0) {
		const object = pending.pop();
		if (object instanceof PDFRef) {
			if (reachable.has(object.tag)) continue;
			reachable.add(object.tag);
			pending.push(context.lookup(object));
		} else if (object instanceof PDFStream) {
			pending.push(object.dict);
		} else if (object instanceof PDFDict) {
			for (const [, value] of object.entries()) pending.push(value);
		} else if (object instanceof PDFArray) {
			pending.push(...object.asArray());
		}
	}
	for (const [ref] of context.enumerateIndirectObjects()) {
		if (!reachable.has(ref.tag)) context.delete(ref);
	}
}
