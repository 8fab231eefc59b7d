// The API's error shape ({ error: { type, message, param, code } }) and the thrown value that carries it.

export class ApiError extends Error {
	/**
	 * @param {number} status
	 * @param {string} message
	 * @param {{ type?: string, param?: string, code?: string, declineCode?: string }} [details]
	 */
	constructor(status, message, details = {}) {
		super(message);
		this.status = status;
		this.type = details.type ?? 'invalid_request_error';
		this.param = details.param;
		this.code = details.code;
		this.declineCode = details.declineCode;
	}

	toBody() {
		/** @type {Record<string, string>} */
		const error = { type: this.type, message: this.message };
		if (this.param !== undefined) error.param = this.param;
		if (this.code !== undefined) error.code = this.code;
		if (this.declineCode !== undefined) error.decline_code = this.declineCode;
		return { error };
	}
}

/** @param {string} param */
export function missingParam(param) {
	return new ApiError(400, `Missing required param: ${param}.`, { param, code: 'parameter_missing' });
}

/** @param {string} param */
export function unknownParam(param) {
	return new ApiError(400, `Received unknown parameter: ${param}`, { param, code: 'parameter_unknown' });
}

/**
 * @param {string} param
 * @param {string} message
 */
export function invalidParam(param, message) {
	return new ApiError(400, message, { param });
}

/**
 * A missing object: 404 when it is named in the URL, 400 when a parameter refers to it (as the API does).
 * @param {string} kind
 * @param {string} id
 * @param {string} [param]
 */
export function noSuch(kind, id, param) {
	return new ApiError(param ? 400 : 404, `No such ${kind}: '${id}'`, { param: param ?? 'id', code: 'resource_missing' });
}
