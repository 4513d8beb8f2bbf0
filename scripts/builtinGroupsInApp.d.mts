import type { Plugin } from 'vite';
export function groupsOfIndex(text: string): Array<{ exportName: string; file: string }>;
export function builtinGroupsInApp(): Plugin;
export function demoFirstGroups(demoText: string, groups: Array<{ exportName: string; file: string }>, namesOf: (file: string) => string[]): string[];
