import type { AnchorStore } from '../audit/anchors';
import { createAnchorObject, listAnchorKeys, readAnchorObject } from './index';

/** The access log's anchor store in the anchor bucket (AUDIT_ANCHOR_BUCKET). */
export const s3AnchorStore: AnchorStore = {
	create: createAnchorObject,
	list: listAnchorKeys,
	read: readAnchorObject
};
