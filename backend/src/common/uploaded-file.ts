/** The part of a multer in-memory upload (`FileInterceptor`) that services use. */
export interface UploadedBytes {
  buffer: Buffer;
  size: number;
  originalname: string;
  mimetype: string;
}
