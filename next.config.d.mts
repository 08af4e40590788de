// Types for next.config.mjs, so tests can import its headers.
import type { NextConfig } from "next";

export declare const securityHeaders: { key: string; value: string }[];
export declare const apiContentSecurityPolicy: string;
declare const nextConfig: NextConfig;
export default nextConfig;
