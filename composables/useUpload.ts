/**
 * Sends a form with XMLHttpRequest, which (unlike fetch) reports upload progress.
 * Resolves with the parsed JSON answer; rejects with the server's message.
 */
export function uploadForm<T>(url: string, form: FormData, onProgress: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open('POST', url)
    xhr.responseType = 'json'
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total)
    }
    xhr.onload = () => {
      const body = xhr.response as { message?: string } | null
      if (xhr.status >= 200 && xhr.status < 300) resolve(body as T)
      else reject(new Error(body?.message ?? `Upload failed (${xhr.status}).`))
    }
    xhr.onerror = () => reject(new Error('The upload was interrupted. Check the connection and try again.'))
    xhr.send(form)
  })
}
