/**
 * A submitted form's text fields, or null when the body is not a readable form. Files and
 * repeated names are ignored: every account form has single text fields.
 */
export async function readForm(request: Request): Promise<Record<string, string> | null> {
	let data: FormData;
	try {
		data = await request.formData();
	} catch {
		return null;
	}
	const fields: Record<string, string> = {};
	for (const [name, value] of data) {
		if (typeof value === 'string' && !(name in fields)) fields[name] = value;
	}
	return fields;
}
