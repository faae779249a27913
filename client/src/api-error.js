// A failed request to the server, carrying the RFC 9457 problem details it sent back where it sent any.
export class ApiError extends Error {
  constructor(status, title, detail, type = 'about:blank', retryAfterSeconds = null) {
    super(detail ? `${title}: ${detail}` : title);
    this.name = 'ApiError';
    this.status = status;
    this.title = title;
    this.detail = detail;
    this.type = type;
    this.retryAfterSeconds = retryAfterSeconds;
  }

  static async fromResponse(response) {
    const retryAfter = Number(response.headers.get('Retry-After'));
    const retryAfterSeconds = Number.isFinite(retryAfter) && retryAfter > 0 ? retryAfter : null;
    let problem = null;
    const type = response.headers.get('Content-Type') ?? '';
    if (type.includes('json')) {
      try {
        problem = await response.json();
      } catch {
        problem = null;
      }
    }
    const title = typeof problem?.title === 'string' ? problem.title : `HTTP ${response.status}`;
    const detail = typeof problem?.detail === 'string' ? problem.detail : response.statusText;
    return new ApiError(response.status, title, detail, problem?.type ?? 'about:blank', retryAfterSeconds);
  }
}
