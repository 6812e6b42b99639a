// The little of s3rver (the storage fake) the tests use; it ships no types.
declare module 's3rver' {
	interface S3rverOptions {
		address?: string;
		port?: number;
		directory?: string;
		silent?: boolean;
		configureBuckets?: { name: string }[];
	}
	export default class S3rver {
		constructor(options: S3rverOptions);
		run(): Promise<{ address: string; port: number }>;
		close(): Promise<void>;
	}
}
