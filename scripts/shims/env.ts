// Lets scripts run the app's server modules under tsx: $env/dynamic/private is the process env.
export const env = process.env as Record<string, string | undefined>;
