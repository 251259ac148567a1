/** Types of bin/methods-page.mjs (the methods page renderer and its Vite plugin). */
import type { Plugin } from 'vite';
export declare const METHODS_SOURCE: string;
export declare function renderInline(text: string): string;
export declare function sectionId(heading: string): string | null;
export declare function renderMethodsHtml(markdown: string): string;
export declare function renderMethodsFile(path?: string): string;
export declare function methodsPagePlugin(): Plugin;
