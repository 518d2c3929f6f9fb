export { PageSkeleton as default } from "@/components/layout/page-skeleton";
