import { error } from '@sveltejs/kit';
import type { Component } from 'svelte';
import type { PageLoad } from './$types';

const lessonFiles = import.meta.glob<{ default: Component }>('/content/**/*.svx');

export const load: PageLoad = async ({ data }) => {
	const importer = data.lesson.contentPath ? lessonFiles[`/${data.lesson.contentPath}`] : undefined;
	if (!importer) error(404, { message: 'This lesson has no text yet.' });
	const { default: body } = await importer();
	return { ...data, body };
};
