// For load balancers and tests: answers once start-up has finished.
export default defineEventHandler(() => ({ ok: true }))
