// Ends this browser's session on the server as well, so a copy of the cookie no longer signs anyone in.
export default defineEventHandler(async (event) => {
  await endSession(event)
  return { message: 'Signed out.' }
})
