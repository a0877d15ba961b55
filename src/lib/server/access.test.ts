import { describe, expect, it } from 'vitest';
import { allows } from './access';

describe('what each role may do', () => {
	// The rule from the product brief: viewers read; editors change builds; owners also manage members.
	it.each([
		['viewer', { read: true, edit: false, manage: false }],
		['editor', { read: true, edit: true, manage: false }],
		['owner', { read: true, edit: true, manage: true }]
	] as const)('%s', (role, expected) => {
		expect({ read: allows(role, 'read'), edit: allows(role, 'edit'), manage: allows(role, 'manage') }).toEqual(expected);
	});
});
